// `npm run bench:insights [base URL]`: signs in as the volume shop's owner (scripts/seed-volume.ts)
// and times each insights route over HTTP against the running app: two warm-up calls, then ten,
// reporting the median and the slowest. The figures in DEVELOPERS.md come from this.
const base = process.argv[2] ?? 'http://127.0.0.1:3000'
const RUNS = 10
const ROUTES = [
  '/api/insights/wear',
  '/api/insights/cost?by=material',
  '/api/insights/cost?by=machine',
  '/api/insights/cost?by=operator',
  '/api/insights/cost?by=type',
  '/api/insights/spend',
  '/api/insights/outcomes',
]

async function main() {
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'volume-owner@example.com', password: 'kerfbook-demo' }),
  })
  if (login.status !== 200) throw new Error(`sign-in answered ${login.status}: run npm run seed:volume first`)
  const cookie = login.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ')
  const timeOne = async (path: string) => {
    const t = performance.now()
    const res = await fetch(base + path, { headers: { cookie } })
    await res.text()
    if (res.status !== 200) throw new Error(`${path} answered ${res.status}`)
    return performance.now() - t
  }
  let page = 0
  for (const path of ROUTES) {
    for (let i = 0; i < 2; i++) await timeOne(path)
    const times: number[] = []
    for (let i = 0; i < RUNS; i++) times.push(await timeOne(path))
    times.sort((a, b) => a - b)
    const median = (times[RUNS / 2 - 1]! + times[RUNS / 2]!) / 2
    if (path !== '/api/insights/cost?by=machine' && path !== '/api/insights/cost?by=operator' && path !== '/api/insights/cost?by=type') page += median
    console.log(`${path.padEnd(34)} median ${median.toFixed(0).padStart(5)} ms   slowest ${times.at(-1)!.toFixed(0).padStart(5)} ms`)
  }
  // The page asks for its four parts at once; time that too.
  const t = performance.now()
  await Promise.all(['/api/insights/wear', '/api/insights/cost?by=material', '/api/insights/spend', '/api/insights/outcomes'].map(timeOne))
  console.log(`the page's four requests together: ${(performance.now() - t).toFixed(0)} ms (one after another: ${page.toFixed(0)} ms)`)
}

main().catch((err) => {
  console.error('[bench] failed:', err instanceof Error ? err.message : err)
  process.exit(1)
})
