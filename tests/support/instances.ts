// Extra app instances for the tests that restart PostgreSQL or run two servers on one database:
// the built app (.output) started with the settings the global setup uses, a shop signed up
// through it, cutters loaded into its machines, and a cut-log sender that retries like the
// phone's queue (the same idempotency key on every try, with a growing pause).
import { execFile, spawn, type ChildProcess } from 'node:child_process'
import { existsSync } from 'node:fs'
import path from 'node:path'
import { promisify } from 'node:util'
import { connect } from '../../server/db/connect'
import { newLabelCode } from '../../shared/kerf/label-code'
import { projectRoot } from './db'

const run = promisify(execFile)

// The same secrets as tests/support/global-setup.ts: instances behind one load balancer share them.
export const SESSION_PASSWORD = 'test-session-password-that-is-long-enough-0123456789'
export const TASK_TOKEN = 'test-task-token-0123456789'

export interface AppInstance {
  url: string
  child: ChildProcess
  /** What the server printed so far (stdout and stderr). */
  output: () => string
  stop: () => Promise<void>
}

export async function startAppInstance(port: number, databaseUrl: string): Promise<AppInstance> {
  const entry = path.join(projectRoot, '.output/server/index.mjs')
  if (!existsSync(entry)) throw new Error('No built app in .output: run the tests with `npm test`, which builds first.')
  const url = `http://127.0.0.1:${port}`
  const smtpPort = process.env.KERFBOOK_TEST_SMTP_PORT ?? '2626'
  const child = spawn(process.execPath, [entry], {
    cwd: projectRoot,
    env: {
      ...process.env,
      HOST: '127.0.0.1',
      PORT: String(port),
      NUXT_DATABASE_URL: databaseUrl,
      NUXT_SESSION_PASSWORD: SESSION_PASSWORD,
      NUXT_SMTP_HOST: '127.0.0.1',
      NUXT_SMTP_PORT: smtpPort,
      NUXT_SMTP_FROM: 'Kerfbook <kerfbook@example.com>',
      NUXT_PUBLIC_BASE_URL: url,
      NUXT_TASK_TOKEN: TASK_TOKEN,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  let printed = ''
  child.stdout!.on('data', (d) => { printed += d })
  child.stderr!.on('data', (d) => { printed += d })
  const instance: AppInstance = {
    url, child,
    output: () => printed,
    stop: async () => {
      if (child.exitCode !== null || child.signalCode !== null) return
      const exited = new Promise((r) => child.once('exit', r))
      child.kill('SIGTERM')
      await exited
    },
  }
  const until = Date.now() + 30_000
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`the app on port ${port} exited with code ${child.exitCode}:\n${printed}`)
    try {
      await fetch(`${url}/api/me`)
      return instance
    } catch {
      await new Promise((r) => setTimeout(r, 150))
    }
  }
  await instance.stop()
  throw new Error(`the app did not answer at ${url}`)
}

/** scripts/pg.sh for a cluster of the test's own (durable commits, its own data folder by port). */
export async function pgScript(command: 'start' | 'stop', port: number): Promise<void> {
  await run('bash', [path.join(projectRoot, 'scripts/pg.sh'), command], {
    cwd: projectRoot, env: { ...process.env, KERFBOOK_PG_PORT: String(port), KERFBOOK_PG_FAST: '0' }, timeout: 90_000,
  })
}

export interface InstanceShop { id: number, cookie: string, cutters: number[], materials: Array<{ id: number, wearFactor: number }>, ratedLife: number }

/** Signs a shop up through the instance and loads `cutterCount` cutters into its machine. */
export async function signUpShop(baseUrl: string, databaseUrl: string, label: string, cutterCount: number): Promise<InstanceShop> {
  const tag = Math.random().toString(36).slice(2, 10)
  const res = await fetch(`${baseUrl}/api/auth/signup`, {
    method: 'POST', headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ shopName: `${label} ${tag}`, name: 'Test Owner', email: `owner-${tag}@example.com`, password: 'correct-horse-battery' }),
  })
  if (res.status !== 201) throw new Error(`sign-up answered ${res.status}: ${await res.text()}`)
  const cookie = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ')
  const id = ((await res.json()) as { shop: { id: number } }).shop.id
  const ratedLife = 600
  const db = connect(databaseUrl, 2)
  try {
    const machine = await db.insertInto('machines').values({ shop_id: id, name: 'Big table', min_rpm: 6000, max_rpm: 24000, pockets: 8 })
      .returning('id').executeTakeFirstOrThrow()
    const type = await db.insertInto('cutter_types').values({
      shop_id: id, name: 'Two-flute upcut 1/4"', profile: 'square_end', helix: 'upcut', flutes: 2, cutting_diameter_mm: 6.35,
      shank_diameter_mm: 6.35, cutting_length_mm: 22, overall_length_mm: 64, rated_life_minutes: ratedLife,
      min_usable_diameter_mm: 6, unit_cost_cents: 3000,
    }).returning('id').executeTakeFirstOrThrow()
    const cutters = await db.insertInto('cutters').values(Array.from({ length: cutterCount }, () => ({
      shop_id: id, type_id: type.id, code: newLabelCode(), diameter_mm: 6.35, status: 'in_spindle' as const, machine_id: machine.id,
    }))).returning('id').execute()
    const materials = await db.selectFrom('materials').select(['id', 'wear_factor']).where('shop_id', '=', id).orderBy('id').execute()
    return { id, cookie, cutters: cutters.map((c) => c.id), materials: materials.map((m) => ({ id: m.id, wearFactor: m.wear_factor })), ratedLife }
  } finally {
    await db.destroy()
  }
}

export interface Sent { status: number, tries: number, unavailable: number, message?: string }

/**
 * Posts one cut log until the app takes it (201, or 200 for a replay), sending the same body and
 * idempotency key each time and pausing 100 ms, 200 ms, ... up to 1 s between tries, as the
 * phone's queue does. Any answer other than 503 fails at once; so does a request that hangs.
 */
export async function postCutWithRetry(baseUrl: string, cookie: string, cutterId: number, body: Record<string, unknown>, deadline: number): Promise<Sent> {
  let pause = 100
  let unavailable = 0
  let message: string | undefined
  for (let tries = 1; ; tries++) {
    const res = await fetch(`${baseUrl}/api/cutters/${cutterId}/cuts`, {
      method: 'POST',
      headers: { cookie, 'content-type': 'application/json', accept: 'application/json' },
      body: JSON.stringify(body),
      // A request during an outage must be answered, not left hanging.
      signal: AbortSignal.timeout(10_000),
    })
    const answer = await res.json() as { message?: string }
    if (res.status === 201 || res.status === 200) return { status: res.status, tries, unavailable, message }
    if (res.status !== 503) throw new Error(`cut log answered ${res.status}: ${JSON.stringify(answer)}`)
    unavailable++
    message = answer.message
    if (Date.now() > deadline) throw new Error(`cut log still refused after ${tries} tries: ${message}`)
    await new Promise((r) => setTimeout(r, pause))
    pause = Math.min(pause * 2, 1000)
  }
}
