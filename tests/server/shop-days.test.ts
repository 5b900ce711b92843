// The insights' days are the shop's days: a cut just before or just after the shop's local
// midnight lands on that local day (a daylight-saving change day included), and changing the
// shop's time zone moves every logged cut to its day in the new zone at once. The oracle is
// outside our code: PostgreSQL's own `AT TIME ZONE` over the raw logs, and the IANA tz
// database's rules for the zones used (America/Chicago: US daylight saving from 02:00 on the
// second Sunday of March, 8 March 2026, UTC-6 before and UTC-5 after; Asia/Tokyo: UTC+9 all year).
import { randomUUID } from 'node:crypto'
import { sql } from 'kysely'
import { beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let fx: SpindleFixture

// Each cut's minutes are a power of two, so a day's total says which cuts it holds.
const CUTS = [
  { minutes: 1, at: '2026-03-08T05:59:00Z' }, // 23:59 CST on Sat 7 March in Chicago; 14:59 on 8 March in Tokyo
  { minutes: 2, at: '2026-03-08T06:01:00Z' }, // 00:01 CST on Sun 8 March (the day the clocks go forward)
  { minutes: 4, at: '2026-03-09T04:59:00Z' }, // 23:59 CDT on 8 March, a day of 23 hours
  { minutes: 8, at: '2026-03-09T05:01:00Z' }, // 00:01 CDT on 9 March; 14:01 on 9 March in Tokyo
  { minutes: 16, at: '2026-07-01T04:59:00Z' }, // 23:59 CDT on 30 June
  { minutes: 32, at: '2026-07-01T05:01:00Z', cleanup: 3 }, // 00:01 CDT on 1 July
]

/** Minutes per day as the roll-ups hold them, and as PostgreSQL's AT TIME ZONE counts the raw logs. */
async function days(zone: string) {
  const db = appDb()
  try {
    const rolled = await sql<{ day: string, minutes: number }>`
      select day::text, sum(minutes)::float8 as minutes from cut_log_daily where shop_id = ${shop.id} group by 1 order by 1`.execute(db)
    const oracle = await sql<{ day: string, minutes: number }>`
      select (cut_at at time zone ${zone})::date::text as day, sum(minutes)::float8 as minutes
      from cut_logs where shop_id = ${shop.id} and voided_at is null group by 1 order by 1`.execute(db)
    const cleanup = await sql<{ day: string, logs: number }>`
      select day::text, sum(logs)::int as logs from cut_cleanup_daily where shop_id = ${shop.id} group by 1 order by 1`.execute(db)
    return { rolled: rolled.rows, oracle: oracle.rows, cleanup: cleanup.rows }
  } finally {
    await db.destroy()
  }
}

/** Logs counted by the outcomes insight over one of the shop's days. */
async function logsOn(day: string): Promise<number> {
  const res = await shop.owner.get(`/api/insights/outcomes?from=${day}&to=${day}`)
  expect(res.status).toBe(200)
  return (res.body as { logs: number }).logs
}

beforeAll(async () => {
  shop = await makeShop('Shop days')
  fx = await addSpindleFixture(shop.id, 1)
  expect((await shop.owner.patch('/api/shop', { timeZone: 'America/Chicago' })).status).toBe(200)
  const materials = (await shop.operator.get('/api/materials')).body as Array<{ id: number }>
  const db = appDb()
  try {
    await db.insertInto('cut_logs').values(CUTS.map((c) => ({
      shop_id: shop.id, cutter_id: fx.cutters[0]!.id, machine_id: fx.machines.changer, operator_id: shop.ids.operator,
      material_id: materials[0]!.id, wear_factor: 1, life_added: 0.001, outcome: 'clean' as const, minutes: c.minutes,
      cut_at: c.at, idempotency_key: `days-${randomUUID()}`, cleanup_minutes_per_part: c.cleanup ?? null,
    }))).execute()
  } finally {
    await db.destroy()
  }
})

describe("the insights' days are the shop's days", () => {
  it('a cut just before and just after local midnight lands on its local day, on a daylight-saving day too', async () => {
    const { rolled, oracle, cleanup } = await days('America/Chicago')
    expect(rolled).toEqual(oracle)
    expect(rolled).toEqual([
      { day: '2026-03-07', minutes: 1 },
      { day: '2026-03-08', minutes: 2 + 4 },
      { day: '2026-03-09', minutes: 8 },
      { day: '2026-06-30', minutes: 16 },
      { day: '2026-07-01', minutes: 32 },
    ])
    expect(cleanup).toEqual([{ day: '2026-07-01', logs: 1 }])
    // Through the insights route: 8 March (23 hours long) holds the two cuts of that local day.
    expect(await logsOn('2026-03-08')).toBe(2)
    expect(await logsOn('2026-03-09')).toBe(1)
    expect(await logsOn('2026-06-30')).toBe(1)
  })

  it("changing the shop's time zone moves the cuts to their days in the new zone at once", async () => {
    const res = await shop.owner.patch('/api/shop', { timeZone: 'Asia/Tokyo' })
    expect(res.status).toBe(200)
    const { rolled, oracle, cleanup } = await days('Asia/Tokyo')
    expect(rolled).toEqual(oracle)
    expect(rolled).toEqual([
      { day: '2026-03-08', minutes: 1 + 2 },
      { day: '2026-03-09', minutes: 4 + 8 },
      { day: '2026-07-01', minutes: 16 + 32 },
    ])
    expect(cleanup).toEqual([{ day: '2026-07-01', logs: 1 }])
    expect(await logsOn('2026-03-09')).toBe(2)
    expect(await logsOn('2026-06-30')).toBe(0)
  })

  it('refuses a zone the browser knows but the database does not, naming the field, and keeps the days as they were', async () => {
    // "US/Pacific-New" was a link in old tz data: ICU (and so the form's own check) still accepts
    // it, PostgreSQL's tz data no longer has it. Every cut's day is worked out in PostgreSQL.
    expect(() => new Intl.DateTimeFormat('en', { timeZone: 'US/Pacific-New' })).not.toThrow()
    const res = await shop.owner.patch('/api/shop', { timeZone: 'US/Pacific-New' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.timeZone).toMatch(/not a time zone this server knows/)
    expect((await shop.owner.get('/api/shop')).body.timeZone).toBe('Asia/Tokyo')
  })

  it('a cut logged after the change is counted in the new zone, and a void takes it out of that day', async () => {
    const materials = (await shop.operator.get('/api/materials')).body as Array<{ id: number }>
    const db = appDb()
    let id: string
    try {
      // 23:30 UTC on 9 March is 08:30 on 10 March in Tokyo.
      id = (await db.insertInto('cut_logs').values({
        shop_id: shop.id, cutter_id: fx.cutters[0]!.id, machine_id: fx.machines.changer, operator_id: shop.ids.operator,
        material_id: materials[0]!.id, wear_factor: 1, life_added: 0.001, outcome: 'clean', minutes: 64,
        cut_at: '2026-03-09T23:30:00Z', idempotency_key: `days-${randomUUID()}`,
      }).returning('id').executeTakeFirstOrThrow()).id
    } finally {
      await db.destroy()
    }
    expect(await logsOn('2026-03-10')).toBe(1)
    const voided = await shop.crib.post(`/api/cut-logs/${id}/void`, { reason: 'Logged on the wrong cutter' })
    expect(voided.status).toBe(200)
    expect(await logsOn('2026-03-10')).toBe(0)
    const { rolled, oracle } = await days('Asia/Tokyo')
    expect(rolled).toEqual(oracle)
  })

  it('a cut written while the zone changes is counted in the zone that wins, never in a stale one', async () => {
    const materials = (await shop.operator.get('/api/materials')).body as Array<{ id: number }>
    const db = appDb()
    try {
      let change: Promise<{ status: number }> | undefined
      await db.transaction().execute(async (tx) => {
        // 20:00 UTC on 1 July is 15:00 on 1 July in Chicago and 05:00 on 2 July in Tokyo.
        await tx.insertInto('cut_logs').values({
          shop_id: shop.id, cutter_id: fx.cutters[0]!.id, machine_id: fx.machines.changer, operator_id: shop.ids.operator,
          material_id: materials[0]!.id, wear_factor: 1, life_added: 0.001, outcome: 'clean', minutes: 128,
          cut_at: '2026-07-01T20:00:00Z', idempotency_key: `days-${randomUUID()}`,
        }).execute()
        // The owner changes the zone while this log is still uncommitted (its trigger read Tokyo).
        change = shop.owner.patch('/api/shop', { timeZone: 'America/Chicago' })
        await new Promise((r) => setTimeout(r, 300))
      })
      expect((await change!).status).toBe(200)
    } finally {
      await db.destroy()
    }
    const { rolled, oracle } = await days('America/Chicago')
    expect(rolled).toEqual(oracle)
    expect(rolled.find((r) => r.day === '2026-07-01')?.minutes).toBe(32 + 128)
    expect(await logsOn('2026-07-02')).toBe(0)
  })

  it("the signed-in person's shop carries its time zone, which the pages' dates and the insights' words use", async () => {
    const me = await shop.operator.get('/api/me')
    expect(me.body.shop.timeZone).toBe('America/Chicago')
  })
})
