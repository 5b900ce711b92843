// The phone benchmark (`npm run bench:phone`, through scripts/bench-phone.sh, which starts
// PostgreSQL and builds the app first). An operator scans a label: the cutter page /c/<code> on a
// phone profile (390 x 844 touch screen, 4x slower CPU, 150 ms latency, 1.6 Mbps down, 750 kbps up),
// signed in, cold cache. Each of N runs (a fresh browser context each) measures
//   - the JavaScript transferred for the page, compressed as sent, and how much of it came compressed;
//   - first contentful paint;
//   - the first tap that works: "Log a cut" is tapped as soon as the page has painted it (the browser
//     reports the frame through the Element Timing API). When that tap is taken (the form opens, or
//     the button shows it is busy with it and the form opens once the page is ready), the tap works
//     from the moment the button was painted, and the time the form opened is shown beside it.
//     Otherwise it was lost, and the button is tapped again and again until a tap opens the form:
//     the last one made before the form appeared is the one that worked;
//   - a repeat scan with a warm cache: once the page has finished loading and any service worker is
//     installed, another cutter's page in the same context, until a tap works;
// then Lighthouse 12's mobile performance score (its own simulated slow-4G, 4x CPU profile).
// Prints the median of the runs.
import { spawn, execFile, type ChildProcess } from 'node:child_process'
import { existsSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { promisify } from 'node:util'
import pg from 'pg'
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core'
import { connect } from '../server/db/connect'
import { DEMO_PASSWORD } from '../server/db/seed/demo'
import { seed } from './seed'

const run = promisify(execFile)
const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)))
const num = (name: string, fallback: number) => {
  const v = Number(process.env[name] ?? fallback)
  if (!Number.isFinite(v) || v < 0) throw new Error(`${name} must be a number`)
  return v
}
const PG_PORT = num('KERFBOOK_PHONE_PG_PORT', 55453)
const APP_PORT = num('KERFBOOK_PHONE_APP_PORT', 3355)
const RUNS = num('KERFBOOK_PHONE_RUNS', 5)
const LIGHTHOUSE = process.env.KERFBOOK_PHONE_LIGHTHOUSE !== '0'
/** KERFBOOK_PHONE_FILES=1 lists each script of the first visit with its size, to see what the page loads. */
const LIST_FILES = process.env.KERFBOOK_PHONE_FILES === '1'
/** KERFBOOK_PHONE_TIMINGS=1 prints where the repeat scan's time went (the page's Performance timings). */
const TIMINGS = process.env.KERFBOOK_PHONE_TIMINGS === '1'
/** KERFBOOK_PHONE_TRACE=<file> writes a Chromium trace of the last run's repeat scan (for chrome://tracing or Perfetto). */
const TRACE = process.env.KERFBOOK_PHONE_TRACE
const CHROMIUM = process.env.KERFBOOK_CHROMIUM || '/usr/bin/chromium'
const CHROMIUM_ARGS = ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
  '--disable-component-update', '--disable-sync']
const DB_NAME = 'kerfbook_phone'
const ADMIN_URL = `postgres://postgres@127.0.0.1:${PG_PORT}/postgres`
const DB_URL = `postgres://postgres@127.0.0.1:${PG_PORT}/${DB_NAME}`
const BASE = `http://127.0.0.1:${APP_PORT}`
// The phone profile of the measurements (the same figures as Lighthouse's mobile preset).
const PROFILE = { cpuSlowdown: 4, latencyMs: 150, downKbps: 1600, upKbps: 750 }

const say = (s: string) => console.log(`[phone] ${s}`)

async function freshDatabase(): Promise<void> {
  const client = new pg.Client({ connectionString: ADMIN_URL })
  await client.connect()
  try {
    await client.query(`drop database if exists ${DB_NAME} with (force)`)
    await client.query(`create database ${DB_NAME}`)
  } finally {
    await client.end()
  }
}

let app: ChildProcess | undefined
async function startApp(): Promise<void> {
  const entry = path.join(root, '.output/server/index.mjs')
  if (!existsSync(entry)) throw new Error('No built app in .output: run `npm run bench:phone`, which builds first.')
  app = spawn(process.execPath, [entry], {
    cwd: root,
    env: {
      ...process.env, HOST: '127.0.0.1', PORT: String(APP_PORT), NODE_ENV: 'production', NUXT_DATABASE_URL: DB_URL,
      NUXT_SESSION_PASSWORD: 'phone-bench-session-password-long-enough-0123456789', NUXT_PUBLIC_BASE_URL: BASE,
      NUXT_SMTP_HOST: '127.0.0.1', NUXT_SMTP_PORT: '9',
    },
    stdio: ['ignore', 'inherit', 'inherit'],
  })
  const until = Date.now() + 30_000
  while (Date.now() < until) {
    if (app.exitCode !== null) throw new Error(`the app exited with code ${app.exitCode}`)
    try {
      await fetch(`${BASE}/api/me`)
      return
    } catch {
      await new Promise((r) => setTimeout(r, 150))
    }
  }
  throw new Error(`the app did not answer at ${BASE}`)
}

async function stopApp(): Promise<void> {
  const child = app
  app = undefined
  if (!child || child.exitCode !== null) return
  const exited = new Promise((r) => child.once('exit', r))
  child.kill('SIGTERM')
  await exited
}

/** Two cutters in a spindle (their page offers "Log a cut") and an operator's session cookie. */
async function fixture(): Promise<{ codes: [string, string], cookie: string }> {
  const db = connect(DB_URL, 1)
  try {
    const rows = await db.selectFrom('cutters').select('code').where('status', '=', 'in_spindle').orderBy('id').limit(2).execute()
    if (rows.length < 2) throw new Error('the demo shop has fewer than two cutters in a spindle')
    const res = await fetch(`${BASE}/api/auth/login`, {
      method: 'POST', headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'operator@example.com', password: DEMO_PASSWORD }),
    })
    if (!res.ok) throw new Error(`sign-in answered ${res.status}: ${await res.text()}`)
    const cookie = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ')
    return { codes: [rows[0]!.code, rows[1]!.code], cookie }
  } finally {
    await db.destroy()
  }
}

interface Run { jsKb: number, jsFiles: number, jsCompressedShare: number, fcpMs: number, seenMs: number, firstTapMs: number, formOpenMs: number, repeatMs: number }

async function phoneContext(browser: Browser, cookie: string): Promise<BrowserContext> {
  const context = await browser.newContext({
    viewport: { width: 390, height: 844 }, deviceScaleFactor: 3, isMobile: true, hasTouch: true,
    userAgent: 'Mozilla/5.0 (Linux; Android 14; Pixel 8) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/131.0 Mobile Safari/537.36',
  })
  await context.addCookies(cookie.split('; ').map((pair) => {
    const at = pair.indexOf('=')
    return { name: pair.slice(0, at), value: pair.slice(at + 1), domain: '127.0.0.1', path: '/' }
  }))
  return context
}

/**
 * When the page painted "Log a cut" (epoch ms), as the browser itself reports it: the button carries
 * `elementtiming`, and the Element Timing API gives the frame its text was first painted in. Asking
 * the page whether the button is visible instead would measure the asking: Playwright's waitFor looks
 * at 0, 20, 70, 170 and 270 ms and then only every 500 ms (a button painted at 0.3 s was seen at
 * 0.8 s), each look waits for the page's main thread, and a quicker loop of looks slows the page.
 */
const PAINT_OBSERVER = `try {
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) {
      if (e.identifier === 'log-a-cut') window.__kerfPainted(performance.timeOrigin + (e.renderTime || e.loadTime))
    }
  }).observe({ type: 'element', buffered: true })
} catch {}`

/** Calls after(): the next time a page of the context reports "Log a cut" painted, from now on. */
async function paintReports(context: BrowserContext): Promise<() => Promise<number>> {
  let waiting: ((at: number) => void) | undefined
  await context.exposeFunction('__kerfPainted', (at: number) => waiting?.(at))
  await context.addInitScript(PAINT_OBSERVER)
  return () => new Promise<number>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('the page never painted "Log a cut"')), 60_000)
    waiting = (at) => {
      clearTimeout(timer)
      waiting = undefined
      resolve(at)
    }
  })
}

/**
 * Taps "Log a cut" as soon as it is painted, until a tap opens the form; answers when each happened.
 * When that first tap is kept, the tap works from the moment the button was painted (tapMs = seenMs;
 * the robot's own tap comes a little later, after it has been told and has found the button).
 */
async function untilATapWorks(page: Page, since: number, painted: Promise<number>): Promise<{ seenMs: number, tapMs: number, openMs: number }> {
  const button = page.getByRole('button', { name: 'Log a cut', exact: true })
  const form = page.locator('#cut-form-heading')
  const seenMs = await painted - since
  const firstTap = Date.now()
  await button.tap({ timeout: 30_000, noWaitAfter: true })
  // Taken? The form opens, or the button shows it is busy with the tap (a page that keeps early taps).
  const taken = await form.isVisible() || await button.getAttribute('aria-busy').then((v) => v === 'true', () => false)
  if (taken) {
    await form.waitFor({ state: 'visible', timeout: 30_000 })
    return { seenMs, tapMs: seenMs, openMs: Date.now() - since }
  }
  const taps: number[] = [firstTap]
  for (let i = 0; i < 400; i++) {
    if (await form.isVisible()) break
    const at = Date.now()
    try {
      await button.tap({ timeout: 1_000, noWaitAfter: true })
      taps.push(at)
    } catch {
      // The button went away: the form is opening.
    }
    if (await form.waitFor({ state: 'visible', timeout: 120 }).then(() => true, () => false)) break
  }
  await form.waitFor({ state: 'visible', timeout: 10_000 })
  // The tap that worked is the last one made before the form appeared.
  return { seenMs, tapMs: (taps.at(-1) ?? Date.now()) - since, openMs: Date.now() - since }
}

async function measure(browser: Browser, codes: [string, string], cookie: string): Promise<Run> {
  const context = await phoneContext(browser, cookie)
  const page = await context.newPage()
  const cdp = await context.newCDPSession(page)
  await cdp.send('Network.enable')
  await cdp.send('Network.setCacheDisabled', { cacheDisabled: false })
  await cdp.send('Network.emulateNetworkConditions', {
    offline: false, latency: PROFILE.latencyMs,
    downloadThroughput: (PROFILE.downKbps * 1000) / 8, uploadThroughput: (PROFILE.upKbps * 1000) / 8,
  })
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: PROFILE.cpuSlowdown })
  const scripts = new Map<string, { encoded: boolean, url: string }>()
  const sizes = new Map<string, number>()
  let counting = true
  cdp.on('Network.responseReceived', (e) => {
    if (!counting || e.type !== 'Script') return
    const headers = Object.fromEntries(Object.entries(e.response.headers).map(([k, v]) => [k.toLowerCase(), String(v)]))
    scripts.set(e.requestId, { encoded: Boolean(headers['content-encoding']), url: e.response.url })
  })
  cdp.on('Network.loadingFinished', (e) => {
    if (counting && scripts.has(e.requestId)) sizes.set(e.requestId, e.encodedDataLength)
  })

  const nextPaint = await paintReports(context)
  const firstPaint = nextPaint()
  const started = Date.now()
  await page.goto(`${BASE}/c/${codes[0]}`, { waitUntil: 'commit' })
  const first = await untilATapWorks(page, started, firstPaint)
  await page.waitForLoadState('networkidle')
  counting = false
  // A phone that scans again has had time to finish what the first visit started.
  await page.evaluate(() => Promise.race([
    navigator.serviceWorker?.getRegistration().then((r) => (r ? navigator.serviceWorker.ready : undefined)),
    new Promise((resolve) => setTimeout(resolve, 30_000)),
  ]))
  await page.waitForLoadState('networkidle')
  const fcpMs = await page.evaluate(() => performance.getEntriesByName('first-contentful-paint')[0]?.startTime ?? NaN)
  const total = [...sizes.values()].reduce((a, b) => a + b, 0)
  const compressed = [...sizes.entries()].filter(([id]) => scripts.get(id)?.encoded).reduce((a, [, b]) => a + b, 0)
  if (LIST_FILES) {
    for (const [id, bytes] of [...sizes.entries()].sort((a, b) => b[1] - a[1])) say(`    ${(bytes / 1024).toFixed(1).padStart(6)} KB  ${scripts.get(id)!.url.replace(BASE, '')}`)
  }

  // A repeat scan: the next label, in the same browser, with its cache and any service worker warm.
  if (TRACE) await browser.startTracing(page, {
    path: TRACE, screenshots: true,
    // Without V8's sampling profiler, which stalls the page when it starts and would be measured too.
    categories: ['toplevel', 'devtools.timeline', 'disabled-by-default-devtools.timeline', 'blink.user_timing', 'loading', 'navigation'],
  })
  const repeatPaint = nextPaint()
  const again = Date.now()
  await page.goto(`${BASE}/c/${codes[1]}`, { waitUntil: 'commit' })
  const repeat = await untilATapWorks(page, again, repeatPaint)
  if (TRACE) await browser.stopTracing()
  if (TIMINGS) say(await repeatTimings(page))
  await context.close()
  return {
    jsKb: total / 1024, jsFiles: sizes.size, jsCompressedShare: total ? compressed / total : 0,
    fcpMs, seenMs: first.seenMs, firstTapMs: first.tapMs, formOpenMs: first.openMs, repeatMs: repeat.tapMs,
  }
}

/** The repeat scan's navigation, resources and paints in ms since the navigation began. */
async function repeatTimings(page: Page): Promise<string> {
  // A string, not a function: tsx names arrow functions with a helper the page does not have.
  return page.evaluate(`(() => {
    const nav = performance.getEntriesByType('navigation')[0]
    const lines = ['    page: worker ' + Math.round(nav.workerStart) + ', request ' + Math.round(nav.requestStart)
      + ', first byte ' + Math.round(nav.responseStart) + ', last byte ' + Math.round(nav.responseEnd)
      + ' (' + nav.encodedBodySize + ' B), DOM interactive ' + Math.round(nav.domInteractive)
      + ', DOM ready ' + Math.round(nav.domContentLoadedEventEnd) + ', loaded ' + Math.round(nav.loadEventEnd)]
    for (const r of performance.getEntriesByType('resource')) {
      if (r.startTime > 3000) continue
      lines.push('    ' + r.name.replace(location.origin, '').slice(0, 60) + ': ' + Math.round(r.startTime) + ' to '
        + Math.round(r.responseEnd) + ' (' + r.initiatorType + ', ' + (r.renderBlockingStatus ?? '') + ', ' + r.transferSize + ' B sent)')
    }
    for (const p of performance.getEntriesByType('paint')) lines.push('    ' + p.name + ' ' + Math.round(p.startTime))
    return lines.join('\\n')
  })()`)
}

async function lighthouseScores(url: string, cookie: string): Promise<number[]> {
  // Lighthouse drives a Chromium of its own over the DevTools protocol; no download is needed.
  const { default: lighthouse } = await import('lighthouse')
  const chromeLauncher = await import('chrome-launcher')
  const scores: number[] = []
  for (let i = 0; i < RUNS; i++) {
    const chrome = await chromeLauncher.launch({ chromePath: CHROMIUM, chromeFlags: ['--headless=new', ...CHROMIUM_ARGS] })
    try {
      const result = await lighthouse(url, {
        port: chrome.port, output: 'json', logLevel: 'error', onlyCategories: ['performance'], extraHeaders: { Cookie: cookie },
      })
      const score = result?.lhr.categories.performance?.score
      if (typeof score !== 'number') throw new Error(`Lighthouse gave no score: ${JSON.stringify(result?.lhr.runtimeError ?? null)}`)
      scores.push(Math.round(score * 100))
      say(`  lighthouse run ${i + 1}: ${Math.round(score * 100)}`)
    } finally {
      chrome.kill()
    }
  }
  return scores
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b)
  return s.length % 2 ? s[(s.length - 1) / 2]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2
}

async function main() {
  say(`fresh database ${DB_NAME}, the demo shop`)
  await freshDatabase()
  await run(process.execPath, ['--import', 'tsx', path.join(root, 'scripts/migrate.ts'), 'latest'], { cwd: root, env: { ...process.env, NUXT_DATABASE_URL: DB_URL } })
  await seed(DB_URL)
  await startApp()
  let browser: Browser | undefined
  try {
    const { codes, cookie } = await fixture()
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS })
    // One unmeasured visit, so that the server's first-request work does not count against run 1.
    await (await fetch(`${BASE}/c/${codes[0]}`, { headers: { cookie } })).text()
    const runs: Run[] = []
    for (let i = 0; i < RUNS; i++) {
      const r = await measure(browser, codes, cookie)
      runs.push(r)
      say(`  run ${i + 1}: JS ${r.jsKb.toFixed(0)} KB in ${r.jsFiles} files (${Math.round(r.jsCompressedShare * 100)} % compressed), `
        + `FCP ${r.fcpMs.toFixed(0)} ms, button seen ${r.seenMs.toFixed(0)} ms, first working tap ${r.firstTapMs.toFixed(0)} ms (form open ${r.formOpenMs} ms), repeat scan ${r.repeatMs.toFixed(0)} ms`)
    }
    await browser.close()
    browser = undefined
    const scores = LIGHTHOUSE ? await lighthouseScores(`${BASE}/c/${codes[0]}`, cookie) : []
    const m = <K extends keyof Run>(k: K) => median(runs.map((r) => r[k]))
    say(`median of ${RUNS}, phone profile (CPU x${PROFILE.cpuSlowdown}, ${PROFILE.latencyMs} ms, ${PROFILE.downKbps / 1000} Mbps down), cold cache, /c/<code>:`)
    say(`  JavaScript transferred   ${m('jsKb').toFixed(0)} KB in ${m('jsFiles')} files (${Math.round(m('jsCompressedShare') * 100)} % of it compressed)`)
    say(`  first contentful paint   ${(m('fcpMs') / 1000).toFixed(2)} s`)
    say(`  "Log a cut" seen         ${(m('seenMs') / 1000).toFixed(2)} s`)
    say(`  first tap that works     ${(m('firstTapMs') / 1000).toFixed(2)} s (the form it asks for open at ${(m('formOpenMs') / 1000).toFixed(2)} s)`)
    say(`  repeat scan, warm cache  ${(m('repeatMs') / 1000).toFixed(2)} s to a working tap`)
    if (scores.length) say(`  Lighthouse 12 mobile performance score ${median(scores)} (runs: ${scores.join(', ')})`)
  } finally {
    await browser?.close()
    await stopApp()
  }
}

main().catch(async (err) => {
  console.error('[phone] failed:', err instanceof Error ? err.stack : err)
  await stopApp()
  process.exit(1)
})
