// A PostgreSQL restart loses no cut log and counts none twice: while operators' phones keep
// sending logs (retrying with the same idempotency key), the database is stopped and started
// again. The app stays up, answers 503 with a sentence to act on while the database is away,
// and afterwards every log is in the database exactly once with every cutter's totals right.
// It runs its own cluster (scripts/pg.sh on a port and data folder of its own) and its own app
// instance, so the shared test cluster that other test files use is never restarted.
import { randomUUID } from 'node:crypto'
import pg from 'pg'
import { afterAll, beforeAll, expect, it } from 'vitest'
import { connect } from '../../server/db/connect'
import { migrate } from '../support/db'
import { pgScript, postCutWithRetry, signUpShop, startAppInstance, type AppInstance, type InstanceShop, type Sent } from '../support/instances'

const PG_PORT = Number(process.env.KERFBOOK_TEST_RESTART_PG_PORT ?? 55451)
const APP_PORT = Number(process.env.KERFBOOK_TEST_RESTART_APP_PORT ?? 3351)
const DB_NAME = 'kerfbook_restart'
const databaseUrl = `postgres://postgres@127.0.0.1:${PG_PORT}/${DB_NAME}`

const LOGS = 160
const SENDERS = 4
let app: AppInstance
let shop: InstanceShop

beforeAll(async () => {
  await pgScript('start', PG_PORT)
  const admin = new pg.Client({ connectionString: `postgres://postgres@127.0.0.1:${PG_PORT}/postgres` })
  await admin.connect()
  try {
    await admin.query(`drop database if exists ${DB_NAME} with (force)`)
    await admin.query(`create database ${DB_NAME}`)
  } finally {
    await admin.end()
  }
  await migrate(databaseUrl)
  app = await startAppInstance(APP_PORT, databaseUrl)
  shop = await signUpShop(app.url, databaseUrl, 'Restart', 6)
})

afterAll(async () => {
  await app?.stop()
  await pgScript('stop', PG_PORT)
})

it('loses no cut log and counts none twice when PostgreSQL restarts under load', { timeout: 60_000 }, async () => {
  const logs = Array.from({ length: LOGS }, (_, i) => ({
    cutterId: shop.cutters[i % shop.cutters.length]!,
    body: { idempotencyKey: `restart-${randomUUID()}`, materialId: shop.materials[i % shop.materials.length]!.id, minutes: 1 + (i % 17) * 0.5, outcome: 'clean' },
  }))
  const deadline = Date.now() + 40_000
  const results: Sent[] = []
  let next = 0
  // Phones sending their queues: each takes the next log and sends it until it is taken.
  const senders = Array.from({ length: SENDERS }, async () => {
    while (next < logs.length) {
      const log = logs[next++]!
      results.push(await postCutWithRetry(app.url, shop.cookie, log.cutterId, log.body, deadline))
      await new Promise((r) => setTimeout(r, 15))
    }
  })
  // Restart once an eighth of the logs are in, so that most are still to be sent while the
  // database is away.
  const restart = (async () => {
    while (results.length < LOGS / 8) await new Promise((r) => setTimeout(r, 20))
    await pgScript('stop', PG_PORT)
    await new Promise((r) => setTimeout(r, 1000))
    await pgScript('start', PG_PORT)
  })()
  await Promise.all([...senders, restart])

  expect(results).toHaveLength(LOGS)
  // The outage was seen, and said so in words a person can act on.
  const refused = results.filter((r) => r.unavailable > 0)
  expect(refused.length).toBeGreaterThan(0)
  expect(refused[0]!.message).toMatch(/database is not reachable right now.*try again/i)
  // The server lived through it: an 'error' event of a pool or client that nobody handles ends
  // plain Node, and Nitro's last-resort trap would print it as uncaught.
  expect(app.child.exitCode).toBeNull()
  expect(app.output().split('\n').filter((line) => /uncaught|unhandled/i.test(line))).toEqual([])
  expect((await fetch(`${app.url}/api/me`, { headers: { cookie: shop.cookie } })).status).toBe(200)

  const db = connect(databaseUrl, 2)
  try {
    const stored = await db.selectFrom('cut_logs').select(['idempotency_key', 'cutter_id', 'minutes', 'life_added'])
      .where('shop_id', '=', shop.id).execute()
    // Every log exactly once: as many rows as logs sent, one per key, each with its own cutter.
    expect(stored).toHaveLength(LOGS)
    const byKey = new Map(stored.map((s) => [s.idempotency_key, s]))
    expect(byKey.size).toBe(LOGS)
    for (const log of logs) expect(byKey.get(log.body.idempotencyKey)?.cutter_id).toBe(log.cutterId)

    const cutters = await db.selectFrom('cutters').select(['id', 'minutes_total', 'minutes_this_life', 'life_used'])
      .where('shop_id', '=', shop.id).execute()
    for (const c of cutters) {
      const mine = logs.filter((l) => l.cutterId === c.id)
      const minutes = mine.reduce((sum, l) => sum + l.body.minutes, 0)
      expect(c.minutes_total).toBeCloseTo(minutes, 6)
      expect(c.minutes_this_life).toBeCloseTo(minutes, 6)
      // Life used by linear damage accumulation: Σ minutes × wear factor / rated life (DEVELOPERS.md).
      const life = mine.reduce((sum, l) => sum + l.body.minutes * shop.materials.find((m) => m.id === l.body.materialId)!.wearFactor / shop.ratedLife, 0)
      expect(c.life_used).toBeCloseTo(life, 4)
      const events = await db.selectFrom('cutter_events').select('id').where('cutter_id', '=', c.id).where('kind', '=', 'cut_logged').execute()
      expect(events).toHaveLength(mine.length)
    }
    const rolledUp = await db.selectFrom('cut_log_daily').select((eb) => eb.fn.sum<number>('logs').as('logs')).where('shop_id', '=', shop.id).executeTakeFirstOrThrow()
    expect(Number(rolledUp.logs)).toBe(LOGS)
  } finally {
    await db.destroy()
  }
})
