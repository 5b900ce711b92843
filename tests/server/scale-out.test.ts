// Two app instances on one database, as behind a load balancer: a session made on one is good
// on the other (sealed cookies, one shared secret); cut logs for the same cutters sent to both,
// each log to both at once with the same idempotency key, are counted once; and the nightly
// report run on both at the same moment sends each shop exactly one e-mail and writes one row.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, expect, it } from 'vitest'
import { connect } from '../../server/db/connect'
import { freshDatabase, migrate } from '../support/db'
import { caughtMail } from '../support/http'
import { postCutWithRetry, signUpShop, startAppInstance, TASK_TOKEN, type AppInstance, type InstanceShop, type Sent } from '../support/instances'

const [PORT_A, PORT_B] = (process.env.KERFBOOK_TEST_SCALE_OUT_APP_PORTS ?? '3352,3353').split(',').map(Number) as [number, number]
const LOGS_PER_SHOP = 40

let databaseUrl: string
let a: AppInstance
let b: AppInstance
const shops: Array<InstanceShop & { to: string }> = []

beforeAll(async () => {
  databaseUrl = await freshDatabase('kerfbook_scale_out')
  await migrate(databaseUrl)
  ;[a, b] = await Promise.all([startAppInstance(PORT_A, databaseUrl), startAppInstance(PORT_B, databaseUrl)])
  // Two shops whose morning report is due now (00:00 UTC has always passed today), each with
  // something to report: one cutter worn past the threshold.
  const db = connect(databaseUrl, 2)
  try {
    for (const label of ['North', 'South']) {
      const shop = await signUpShop(label === 'North' ? a.url : b.url, databaseUrl, `Scale-out ${label}`, 4)
      const to = `crib-${randomUUID().slice(0, 8)}@example.com`
      await db.updateTable('shops').set({ time_zone: 'UTC', report_time: '00:00', report_recipients: [to] }).where('id', '=', shop.id).execute()
      await db.updateTable('cutters').set({ life_used: 0.95 }).where('id', '=', shop.cutters[0]!).execute()
      shops.push({ ...shop, to })
    }
  } finally {
    await db.destroy()
  }
})

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()])
})

const runNightly = (instance: AppInstance) => fetch(`${instance.url}/api/tasks/report-nightly`, {
  method: 'POST', headers: { authorization: `Bearer ${TASK_TOKEN}` },
}).then(async (r) => ({ status: r.status, body: await r.json() as Array<{ shopId: number, status: string }> }))

it('counts every log once and sends one report per shop with two instances on one database', { timeout: 60_000 }, async () => {
  // A session made on one instance is good on the other.
  for (const shop of shops) {
    for (const instance of [a, b]) expect((await fetch(`${instance.url}/api/me`, { headers: { cookie: shop.cookie } })).status).toBe(200)
  }

  const logs = shops.flatMap((shop) => Array.from({ length: LOGS_PER_SHOP }, (_, i) => ({
    shop,
    cutterId: shop.cutters[i % shop.cutters.length]!,
    body: { idempotencyKey: `scale-${randomUUID()}`, materialId: shop.materials[i % shop.materials.length]!.id, minutes: 2 + (i % 9), outcome: 'clean' },
  })))
  const deadline = Date.now() + 40_000
  const answers: Array<[Sent, Sent]> = []
  let next = 0
  // Four phones; each log goes to both instances at once, as a retry through a load balancer can.
  const senders = Array.from({ length: 4 }, async () => {
    while (next < logs.length) {
      const log = logs[next++]!
      answers.push(await Promise.all([a, b].map((instance) =>
        postCutWithRetry(instance.url, log.shop.cookie, log.cutterId, log.body, deadline))) as [Sent, Sent])
    }
  })
  // The scheduler of each instance fires at the same moment while the logs are coming in.
  const reports = (async () => {
    while (answers.length < logs.length / 4) await new Promise((r) => setTimeout(r, 20))
    return Promise.all([runNightly(a), runNightly(b)])
  })()
  const [[fromA, fromB]] = await Promise.all([reports, ...senders])

  // Each log: one instance wrote it (201), the other answered the same log back (200).
  expect(answers).toHaveLength(logs.length)
  for (const pair of answers) expect(pair.map((s) => s.status).sort()).toEqual([200, 201])

  expect(fromA.status).toBe(200)
  expect(fromB.status).toBe(200)
  const db = connect(databaseUrl, 2)
  try {
    for (const shop of shops) {
      // One instance sent it; the other found the shop locked or its report already done.
      const outcomes = [...fromA.body, ...fromB.body].filter((o) => o.shopId === shop.id).map((o) => o.status)
      expect(outcomes.filter((s) => s === 'sent')).toHaveLength(1)
      expect(outcomes.every((s) => ['sent', 'busy', 'already_done'].includes(s))).toBe(true)
      expect((await caughtMail()).filter((m) => m.to.includes(shop.to) && m.subject.startsWith('Tooling report'))).toHaveLength(1)
      const rows = await db.selectFrom('tooling_reports').select(['status']).where('shop_id', '=', shop.id).execute()
      expect(rows).toEqual([{ status: 'sent' }])

      const mine = logs.filter((l) => l.shop === shop)
      const stored = await db.selectFrom('cut_logs').select(['idempotency_key']).where('shop_id', '=', shop.id).execute()
      expect(stored).toHaveLength(mine.length)
      expect(new Set(stored.map((s) => s.idempotency_key))).toEqual(new Set(mine.map((l) => l.body.idempotencyKey)))
      const cutters = await db.selectFrom('cutters').select(['id', 'minutes_total', 'life_used']).where('shop_id', '=', shop.id).execute()
      for (const c of cutters) {
        const its = mine.filter((l) => l.cutterId === c.id)
        expect(c.minutes_total).toBeCloseTo(its.reduce((sum, l) => sum + l.body.minutes, 0), 6)
        // Life used by linear damage accumulation: Σ minutes × wear factor / rated life (DEVELOPERS.md),
        // on top of the 0.95 the worn cutter started with.
        const life = its.reduce((sum, l) => sum + l.body.minutes * shop.materials.find((m) => m.id === l.body.materialId)!.wearFactor / shop.ratedLife, 0)
        expect(c.life_used).toBeCloseTo((c.id === shop.cutters[0] ? 0.95 : 0) + life, 4)
        const events = await db.selectFrom('cutter_events').select('id').where('cutter_id', '=', c.id).where('kind', '=', 'cut_logged').execute()
        expect(events).toHaveLength(its.length)
      }
      const rolledUp = await db.selectFrom('cut_log_daily').select((eb) => eb.fn.sum<number>('logs').as('logs')).where('shop_id', '=', shop.id).executeTakeFirstOrThrow()
      expect(Number(rolledUp.logs)).toBe(mine.length)
    }
  } finally {
    await db.destroy()
  }
  for (const instance of [a, b]) expect(instance.output().split('\n').filter((line) => /uncaught|unhandled|\[request error\]/i.test(line))).toEqual([])
})
