// The log-a-cut benchmark (`npm run bench`, through scripts/bench.sh, which starts PostgreSQL
// and builds the app first). In one run it measures
//   (a) POST /api/cutters/<id>/cuts on the built app with autocannon: N connections, a signed-in
//       session cookie, every request a new idempotency key, the cutters and materials rotating
//       so that requests in flight touch different cutters;
//   (b) the statements that route sends, straight to PostgreSQL with pgbench: the same number of
//       clients, the same cutters and materials, one transaction a log;
// and prints requests per second and p50/p95/p99 latency for both, and the ratio (a)/(b).
// Settings (environment): KERFBOOK_BENCH_PG_PORT, KERFBOOK_BENCH_APP_PORT, KERFBOOK_BENCH_SECONDS,
// KERFBOOK_BENCH_WARMUP_SECONDS, KERFBOOK_BENCH_CONNECTIONS, KERFBOOK_BENCH_CUTTERS,
// KERFBOOK_BENCH_MACHINES, KERFBOOK_BENCH_PGBENCH_MODE, NUXT_DATABASE_POOL_SIZE (the app's pool).
import { spawn, execFile, type ChildProcess } from 'node:child_process'
import { randomUUID } from 'node:crypto'
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { promisify } from 'node:util'
import autocannon from 'autocannon'
import { sql } from 'kysely'
import pg from 'pg'
import { connect, type Db } from '../server/db/connect'
import { newLabelCode } from '../shared/kerf/label-code'

const run = promisify(execFile)
const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)))

const num = (name: string, fallback: number) => {
  const v = Number(process.env[name] ?? fallback)
  if (!Number.isFinite(v) || v <= 0) throw new Error(`${name} must be a positive number`)
  return v
}
const PG_PORT = num('KERFBOOK_BENCH_PG_PORT', 55450)
const APP_PORT = num('KERFBOOK_BENCH_APP_PORT', 3350)
const SECONDS = num('KERFBOOK_BENCH_SECONDS', 15)
const WARMUP = num('KERFBOOK_BENCH_WARMUP_SECONDS', 3)
const CONNECTIONS = num('KERFBOOK_BENCH_CONNECTIONS', 32)
const CUTTERS = num('KERFBOOK_BENCH_CUTTERS', 256)
const MACHINES = num('KERFBOOK_BENCH_MACHINES', 4)
// pgbench's query protocol: 'prepared' (parse once per connection, the database at its best),
// 'extended' or 'simple'.
const PGBENCH_MODE = process.env.KERFBOOK_BENCH_PGBENCH_MODE ?? 'prepared'
const DB_NAME = 'kerfbook_bench'
const ADMIN_URL = `postgres://postgres@127.0.0.1:${PG_PORT}/postgres`
const DB_URL = `postgres://postgres@127.0.0.1:${PG_PORT}/${DB_NAME}`
const BASE = `http://127.0.0.1:${APP_PORT}`

const say = (s: string) => console.log(`[bench] ${s}`)

// ---- the database and the shop ----------------------------------------------------------------

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

interface Fixture { shopId: number, userId: number, sessionId: string, cookie: string, cutters: number[], materials: number[] }

/** Signs a shop up through the app (its owner, materials, chip loads) and loads cutters into its machines. */
async function makeShop(db: Db): Promise<Fixture> {
  const res = await fetch(`${BASE}/api/auth/signup`, {
    method: 'POST', headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ shopName: 'Bench Routing Co', name: 'Bench Owner', email: `bench-${randomUUID().slice(0, 8)}@example.com`, password: 'bench-password-123' }),
  })
  if (res.status !== 201) throw new Error(`sign-up answered ${res.status}: ${await res.text()}`)
  const cookie = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ')
  const me = await res.json() as { id: number, shop: { id: number } }
  const shopId = me.shop.id
  const machines = await db.insertInto('machines').values(Array.from({ length: MACHINES }, (_, i) => ({
    shop_id: shopId, name: `Router ${i + 1}`, min_rpm: 6000, max_rpm: 24000, pockets: 8,
  }))).returning('id').execute()
  const type = await db.insertInto('cutter_types').values({
    shop_id: shopId, name: 'Bench two-flute 1/4"', profile: 'square_end', helix: 'upcut', flutes: 2, cutting_diameter_mm: 6.35,
    shank_diameter_mm: 6.35, cutting_length_mm: 22, overall_length_mm: 64, rated_life_minutes: 600,
    min_usable_diameter_mm: 6, unit_cost_cents: 3000,
  }).returning('id').executeTakeFirstOrThrow()
  const cutters = await db.insertInto('cutters').values(Array.from({ length: CUTTERS }, (_, i) => ({
    shop_id: shopId, type_id: type.id, code: newLabelCode(), diameter_mm: 6.35, status: 'in_spindle' as const, machine_id: machines[i % MACHINES]!.id,
  }))).returning('id').execute()
  const materials = await db.selectFrom('materials').select('id').where('shop_id', '=', shopId).orderBy('id').execute()
  const ids = cutters.map((c) => c.id).sort((a, b) => a - b)
  // pgbench picks cutters and materials by arithmetic on the first id: they must be consecutive.
  if (ids.at(-1)! - ids[0]! !== ids.length - 1) throw new Error('cutter ids are not consecutive')
  const materialIds = materials.map((m) => m.id)
  if (materialIds.at(-1)! - materialIds[0]! !== materialIds.length - 1) throw new Error('material ids are not consecutive')
  // The session the sign-up started, which every request of (a) reads; (b) reads the same row.
  const session = await db.selectFrom('user_sessions').select('id').where('user_id', '=', me.id).executeTakeFirstOrThrow()
  return { shopId, userId: me.id, sessionId: session.id, cookie, cutters: ids, materials: materialIds }
}

/** Empties the logs, their roll-ups and the rows that point at them, and resets the cutters, so both runs start alike. */
async function resetLogs(db: Db, shopId: number): Promise<void> {
  await sql`truncate cut_logs, cut_log_changes, nc_run_logs, cutter_events, cut_log_daily, cut_sharp_lives`.execute(db)
  await db.updateTable('cutters').set({ life_used: 0, minutes_this_life: 0, minutes_total: 0 }).where('shop_id', '=', shopId).execute()
  await sql`vacuum analyze`.execute(db)
  await sql`checkpoint`.execute(db)
}

// The cutter and material of the n-th request: cutters in turn, the material following the cutter.
const cutterAt = (f: Fixture, n: number) => f.cutters[n % f.cutters.length]!
const materialFor = (f: Fixture, cutterId: number) => f.materials[(cutterId - f.cutters[0]!) % f.materials.length]!
const minutesFor = (n: number) => 1 + (n % 30)

// ---- the app -----------------------------------------------------------------------------------

let app: ChildProcess | undefined

async function startApp(): Promise<void> {
  const entry = path.join(root, '.output/server/index.mjs')
  if (!existsSync(entry)) throw new Error('No built app in .output: run `npm run bench`, which builds first.')
  app = spawn(process.execPath, [...(process.env.KERFBOOK_BENCH_NODE_FLAGS ?? '').split(' ').filter(Boolean), entry], {
    cwd: root,
    env: {
      ...process.env,
      HOST: '127.0.0.1',
      PORT: String(APP_PORT),
      NODE_ENV: 'production',
      NUXT_DATABASE_URL: DB_URL,
      NUXT_SESSION_PASSWORD: 'bench-session-password-that-is-long-enough-0123456789',
      NUXT_PUBLIC_BASE_URL: BASE,
      // No mail server: nothing in this benchmark sends mail.
      NUXT_SMTP_HOST: '127.0.0.1',
      NUXT_SMTP_PORT: '9',
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

// ---- CPU time, from /proc: robust where wall-clock rates are not (other work on the machine) ----

const TICK_MS = 10 // USER_HZ is 100 on Linux
function procTimes(pid: number): { own: number, children: number, ppid: number } | undefined {
  try {
    // Fields after the command name: state ppid ... utime(14) stime(15) cutime(16) cstime(17)
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8')
    const f = stat.slice(stat.lastIndexOf(')') + 2).split(' ')
    return { ppid: Number(f[1]), own: (Number(f[11]) + Number(f[12])) * TICK_MS, children: (Number(f[13]) + Number(f[14])) * TICK_MS }
  } catch {
    return undefined
  }
}

/** CPU milliseconds of the PostgreSQL server: the postmaster, its live children and those it has reaped. */
function postgresCpu(postmaster: number): number {
  const main = procTimes(postmaster)
  if (!main) return Number.NaN
  let total = main.own + main.children
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue
    const t = procTimes(Number(entry))
    if (t?.ppid === postmaster) total += t.own
  }
  return total
}

interface Cpu { app: number, postgres: number, load: number }
/** CPU in ms so far: the app, PostgreSQL, and the load generator (this process and the pgbench runs it has waited for). */
function cpuNow(postmaster: number): Cpu {
  const self = procTimes(process.pid)!
  return { app: app?.pid ? procTimes(app.pid)?.own ?? 0 : 0, postgres: postgresCpu(postmaster), load: self.own + self.children }
}
const cpuSince = (a: Cpu, b: Cpu, requests: number) =>
  `CPU per log: app ${((b.app - a.app) / requests).toFixed(2)} ms, PostgreSQL ${((b.postgres - a.postgres) / requests).toFixed(2)} ms, load generator ${((b.load - a.load) / requests).toFixed(2)} ms`

// ---- figures -----------------------------------------------------------------------------------

interface Figures { requests: number, seconds: number, perSecond: number, p50: number, p95: number, p99: number, failed: number }

/** Nearest-rank percentile of sorted latencies in milliseconds. */
function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return Number.NaN
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!
}

function figures(latencies: number[], seconds: number, failed: number): Figures {
  const sorted = [...latencies].sort((a, b) => a - b)
  return {
    requests: sorted.length, seconds, perSecond: sorted.length / seconds,
    p50: percentile(sorted, 50), p95: percentile(sorted, 95), p99: percentile(sorted, 99), failed,
  }
}

// ---- (a) the route over HTTP -------------------------------------------------------------------

async function runAutocannon(f: Fixture, seconds: number): Promise<Figures> {
  let n = 0
  const latencies: number[] = []
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({
      url: BASE,
      connections: CONNECTIONS,
      duration: seconds,
      headers: { cookie: f.cookie, 'content-type': 'application/json', accept: 'application/json' },
      requests: [{
        method: 'POST',
        setupRequest: (req) => {
          const i = n++
          const cutter = cutterAt(f, i)
          req.path = `/api/cutters/${cutter}/cuts`
          req.body = JSON.stringify({ idempotencyKey: `bench-${randomUUID()}`, materialId: materialFor(f, cutter), minutes: minutesFor(i), outcome: 'clean' })
          return req
        },
      }],
    }, (err, res) => (err ? reject(err) : resolve(res)))
    instance.on('response', (_client, status, _bytes, ms) => {
      if (status === 201) latencies.push(ms)
    })
  })
  return figures(latencies, result.duration, result.requests.total - latencies.length + result.errors + result.timeouts)
}

// ---- (b) the same statements with pgbench ------------------------------------------------------

function pgBin(name: string): string {
  const dirs = readdirSync('/usr/lib/postgresql').sort((a, b) => Number(a) - Number(b))
  const found = dirs.map((d) => `/usr/lib/postgresql/${d}/bin/${name}`).filter(existsSync).at(-1)
  if (!found) throw new Error(`${name} not found: scripts/pg.sh installs Debian's postgresql package`)
  return found
}

/**
 * What POST /api/cutters/:id/cuts sends for a new log, statement by statement (Kysely's SQL,
 * read off server/utils/spindle/cuts.ts, server/utils/platform/auth.ts and server/utils/spindle/spindle.ts; see DEVELOPERS.md).
 */
export function pgbenchScript(): string {
  return `-- One logged cut, as the route sends it.
\\set cutter random(:first_cutter, :first_cutter + :cutters - 1)
\\set material :first_material + (:cutter - :first_cutter) % :materials
\\set minutes random(1, 30)
\\set key random(1, 1000000000000000)
${readFileSync(path.join(root, 'scripts/bench-cuts.sql'), 'utf8')}`
}

async function runPgbench(f: Fixture, seconds: number, log: boolean): Promise<Figures> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'kerfbook-bench-'))
  try {
    const script = path.join(dir, 'cut.sql')
    writeFileSync(script, pgbenchScript())
    const args = [
      '-h', '127.0.0.1', '-p', String(PG_PORT), '-U', 'postgres', '-n', '-M', PGBENCH_MODE,
      '-c', String(CONNECTIONS), '-j', String(Math.min(os.cpus().length, CONNECTIONS)), '-T', String(seconds),
      '-f', script,
      '-D', `shop=${f.shopId}`, '-D', `user=${f.userId}`, '-D', `sid=${f.sessionId}`, '-D', `first_cutter=${f.cutters[0]}`, '-D', `cutters=${f.cutters.length}`,
      '-D', `first_material=${f.materials[0]}`, '-D', `materials=${f.materials.length}`,
      ...(log ? ['-l', `--log-prefix=${path.join(dir, 'tx')}`] : []),
      DB_NAME,
    ]
    const { stdout } = await run(pgBin('pgbench'), args, { cwd: dir, maxBuffer: 16 * 1024 * 1024 })
    const failed = Number(/number of failed transactions: (\d+)/.exec(stdout)?.[1] ?? 0)
    if (!log) return figures([], seconds, failed)
    // Per-transaction log lines: client_id transaction_no time(µs) script_no time_epoch time_us
    const latencies: number[] = []
    for (const file of readdirSync(dir).filter((n) => n.startsWith('tx'))) {
      for (const line of readFileSync(path.join(dir, file), 'utf8').split('\n')) {
        const us = Number(line.split(' ')[2])
        if (line && Number.isFinite(us)) latencies.push(us / 1000)
      }
    }
    return figures(latencies, seconds, failed)
  } finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

// ---- the run -----------------------------------------------------------------------------------

async function checkTotals(db: Db, f: Fixture, label: string): Promise<void> {
  const row = await sql<{ logs: number, events: number, minutes: number, cutter_minutes: number, daily_logs: number }>`
    select (select count(*) from cut_logs where shop_id = ${f.shopId})::int as logs,
           (select count(*) from cutter_events where shop_id = ${f.shopId} and kind = 'cut_logged')::int as events,
           (select coalesce(sum(minutes), 0) from cut_logs where shop_id = ${f.shopId})::float8 as minutes,
           (select coalesce(sum(minutes_total), 0) from cutters where shop_id = ${f.shopId})::float8 as cutter_minutes,
           (select coalesce(sum(logs), 0) from cut_log_daily where shop_id = ${f.shopId})::int as daily_logs`.execute(db)
  const t = row.rows[0]!
  const ok = t.logs === t.events && t.logs === t.daily_logs && Math.abs(t.minutes - t.cutter_minutes) < 0.01
  say(`${label}: ${t.logs} logs, ${t.events} events, ${t.daily_logs} in the daily roll-up, ${t.minutes} min logged, ${t.cutter_minutes} min on the cutters${ok ? '' : '  MISMATCH'}`)
  if (!ok) throw new Error(`${label}: the totals do not add up`)
}

const fmt = (x: number, d = 1) => x.toFixed(d)

async function main() {
  const load = os.loadavg().map((l) => l.toFixed(2)).join(' ')
  say(`PostgreSQL on 127.0.0.1:${PG_PORT} (durable commits), app on ${BASE}; ${CONNECTIONS} connections, ${CUTTERS} cutters in ${MACHINES} machines, ${SECONDS} s each after ${WARMUP} s of warm-up`)
  await freshDatabase()
  await run(process.execPath, ['--import', 'tsx', path.join(root, 'scripts/migrate.ts'), 'latest'], { cwd: root, env: { ...process.env, NUXT_DATABASE_URL: DB_URL } })
  const db = connect(DB_URL, 2)
  try {
    await startApp()
    const f = await makeShop(db)
    say(`shop ${f.shopId}: cutters ${f.cutters[0]}..${f.cutters.at(-1)}, ${f.materials.length} materials`)

    // The postmaster's pid is the first line of postmaster.pid in the data folder.
    const dataDir = (await sql<{ data_directory: string }>`show data_directory`.execute(db)).rows[0]!.data_directory
    const postmaster = Number(readFileSync(path.join(dataDir, 'postmaster.pid'), 'utf8').split('\n')[0])

    await resetLogs(db, f.shopId)
    await runAutocannon(f, WARMUP)
    let before = cpuNow(postmaster)
    const http = await runAutocannon(f, SECONDS)
    const httpCpu = cpuSince(before, cpuNow(postmaster), http.requests + http.failed)
    await stopApp()
    await checkTotals(db, f, 'after the HTTP runs')

    await resetLogs(db, f.shopId)
    await runPgbench(f, WARMUP, false)
    before = cpuNow(postmaster)
    const direct = await runPgbench(f, SECONDS, true)
    const directCpu = cpuSince(before, cpuNow(postmaster), direct.requests + direct.failed)
    await checkTotals(db, f, 'after the pgbench runs')

    const row = (name: string, r: Figures) =>
      `${name.padEnd(34)} ${fmt(r.perSecond).padStart(8)} ${fmt(r.p50, 2).padStart(8)} ${fmt(r.p95, 2).padStart(8)} ${fmt(r.p99, 2).padStart(8)} ${String(r.failed).padStart(7)}`
    console.log('')
    console.log(`${'log a cut'.padEnd(34)} ${'per s'.padStart(8)} ${'p50 ms'.padStart(8)} ${'p95 ms'.padStart(8)} ${'p99 ms'.padStart(8)} ${'failed'.padStart(7)}`)
    console.log(row(`(a) HTTP, autocannon -c ${CONNECTIONS}`, http))
    console.log(row(`(b) SQL, pgbench -c ${CONNECTIONS} -M ${PGBENCH_MODE}`, direct))
    console.log(`ratio (a)/(b): ${fmt(http.perSecond / direct.perSecond, 2)}`)
    console.log(`(a) ${httpCpu}`)
    console.log(`(b) ${directCpu}`)
    console.log(`load average before the run: ${load}; after: ${os.loadavg().map((l) => l.toFixed(2)).join(' ')}; ${os.cpus().length} cores`)
    if (http.failed || direct.failed) throw new Error('some requests failed')
  } finally {
    await stopApp()
    await db.destroy()
  }
}

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, () => {
    void stopApp().finally(() => process.exit(130))
  })
}

main().catch(async (err) => {
  console.error('[bench] failed:', err instanceof Error ? err.message : err)
  await stopApp()
  process.exit(1)
})
