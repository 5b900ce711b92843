// Correcting and voiding cut logs: who may, what moves (the cutter's minutes and life used, the
// daily and sharp-life roll-ups, the reorder demand), what the history says, and that repeats,
// corrections below zero and logs of an earlier sharp life do no harm. The roll-ups are checked
// against a recount of the logs written here, not against the app's own rebuild function.
import { randomUUID } from 'node:crypto'
import { sql } from 'kysely'
import { beforeAll, describe, expect, it } from 'vitest'
import { withDb } from '../support/db'
import { Client } from '../support/http'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let other: TestShop
let fx: SpindleFixture
let mat: Record<string, { id: number, wearFactor: number }>

const RATED = 600
const cut = async (client: Client, cutterId: number, materialId: number, minutes: number) => {
  const res = await client.post(`/api/cutters/${cutterId}/cuts`, { idempotencyKey: `fix-${randomUUID()}`, outcome: 'clean', materialId, minutes })
  expect(res.status).toBe(201)
  return Number(res.body.log.id)
}

/** The cutter's totals, and what its counting logs add up to. */
async function cutterAndRecount(cutterId: number) {
  return withDb(async (db) => {
    const c = await db.selectFrom('cutters').select(['minutes_total', 'minutes_this_life', 'life_used', 'regrind_count']).where('id', '=', cutterId).executeTakeFirstOrThrow()
    const logs = await db.selectFrom('cut_logs').select(['minutes', 'life_added', 'regrind_count']).where('cutter_id', '=', cutterId).where('voided_at', 'is', null).execute()
    const thisLife = logs.filter((l) => l.regrind_count === c.regrind_count)
    return {
      cutter: c,
      recount: {
        minutesTotal: logs.reduce((s, l) => s + l.minutes, 0),
        minutesThisLife: thisLife.reduce((s, l) => s + l.minutes, 0),
        lifeUsed: thisLife.reduce((s, l) => s + l.life_added, 0),
      },
    }
  })
}

/** Both roll-ups of the shop as stored, and as recounted here from its counting logs. */
async function rollUps(shopId: number) {
  return withDb(async (db) => {
    const daily = await sql<Record<string, unknown>>`
      select day::text, material_id, machine_id, operator_id, type_id, logs, minutes::float8, round(new_lives, 4)::float8 as new_lives,
        clean, melted, chip_out, fuzzy, broken
      from cut_log_daily where shop_id = ${shopId} order by 1, 2, 3, 4, 5`.execute(db)
    const dailyRecount = await sql<Record<string, unknown>>`
      select (l.cut_at at time zone s.time_zone)::date::text as day, l.material_id, l.machine_id, l.operator_id, c.type_id, count(*)::int as logs,
        sum(l.minutes)::float8 as minutes, round(sum(l.minutes * l.wear_factor / t.rated_life_minutes), 4)::float8 as new_lives,
        count(*) filter (where outcome = 'clean')::int as clean, count(*) filter (where outcome = 'melted')::int as melted,
        count(*) filter (where outcome = 'chip_out')::int as chip_out, count(*) filter (where outcome = 'fuzzy')::int as fuzzy,
        count(*) filter (where outcome = 'broken')::int as broken
      from cut_logs l join shops s on s.id = l.shop_id join cutters c on c.id = l.cutter_id join cutter_types t on t.id = c.type_id
      where l.shop_id = ${shopId} and l.voided_at is null
      group by 1, 2, 3, 4, 5 order by 1, 2, 3, 4, 5`.execute(db)
    const lives = await sql<Record<string, unknown>>`
      select cutter_id, regrind_count, logs, minutes::float8, round(sharp_share, 6)::float8 as sharp_share, material_minutes, last_cut_at
      from cut_sharp_lives where shop_id = ${shopId} order by 1, 2`.execute(db)
    const livesRecount = await sql<{ cutter_id: number, regrind_count: number, material_id: number, logs: number, minutes: number, sharp_share: number, last_cut_at: Date }>`
      select cutter_id, regrind_count, material_id, count(*)::int as logs, sum(minutes)::float8 as minutes,
        sum(life_added / wear_factor)::float8 as sharp_share, max(cut_at) as last_cut_at
      from cut_logs where shop_id = ${shopId} and voided_at is null group by 1, 2, 3 order by 1, 2, 3`.execute(db)
    const byLife = new Map<string, Record<string, unknown> & { material_minutes: Record<string, number> }>()
    for (const r of livesRecount.rows) {
      const key = `${r.cutter_id}/${r.regrind_count}`
      const life = byLife.get(key) ?? { cutter_id: r.cutter_id, regrind_count: r.regrind_count, logs: 0, minutes: 0, sharp_share: 0, material_minutes: {}, last_cut_at: r.last_cut_at }
      life.logs = (life.logs as number) + r.logs
      life.minutes = (life.minutes as number) + r.minutes
      life.sharp_share = (life.sharp_share as number) + r.sharp_share
      life.material_minutes[String(r.material_id)] = r.minutes
      if (r.last_cut_at > (life.last_cut_at as Date)) life.last_cut_at = r.last_cut_at
      byLife.set(key, life)
    }
    const recounted = [...byLife.values()].map((l) => ({ ...l, minutes: Math.round((l.minutes as number) * 100) / 100, sharp_share: Math.round((l.sharp_share as number) * 1e6) / 1e6 }))
    return { daily: daily.rows, dailyRecount: dailyRecount.rows, lives: lives.rows, livesRecount: recounted }
  })
}

async function expectRollUpsMatchRecount(shopId: number) {
  const r = await rollUps(shopId)
  expect(r.daily).toEqual(r.dailyRecount)
  expect(r.lives).toEqual(r.livesRecount)
}

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Corrections'), makeShop('Corrections elsewhere')])
  fx = await addSpindleFixture(shop.id, 6, RATED)
  const list = (await shop.operator.get('/api/materials')).body as Array<{ id: number, name: string, wearFactor: number }>
  mat = Object.fromEntries(list.map((m) => [m.name, m]))
  for (const c of fx.cutters) expect((await shop.crib.post(`/api/cutters/${c.id}/load`, { machineId: fx.machines.changer })).status).toBe(200)
})

describe('the operator corrects their own cut', () => {
  it('the minutes change, and the cutter\'s minutes and life used follow exactly', async () => {
    const c = fx.cutters[0]!
    const logId = await cut(shop.operator, c.id, mat.MDF!.id, 30)
    const res = await shop.operator.patch(`/api/cut-logs/${logId}`, { minutes: 20, reason: 'Typed 30 for 20' })
    expect(res.status).toBe(200)
    // Miner's rule: 20 min x MDF's 1.0 / 600 min rated.
    expect(res.body.cutter.lifeUsed).toBeCloseTo(20 * mat.MDF!.wearFactor / RATED, 6)
    expect(res.body.cutter).toMatchObject({ id: c.id, minutesTotal: 20, minutesThisLife: 20 })
    expect(res.body.cutter.recentCuts[0]).toMatchObject({ id: logId, minutes: 20 })
    const { cutter, recount } = await cutterAndRecount(c.id)
    expect(cutter.minutes_total).toBe(recount.minutesTotal)
    expect(cutter.life_used).toBeCloseTo(recount.lifeUsed, 6)
    await expectRollUpsMatchRecount(shop.id)
  })

  it('the history says what changed, by whom and why', async () => {
    const c = fx.cutters[0]!
    const history = (await shop.crib.get(`/api/cutters/${c.id}/history`)).body
    const entry = history.entries.find((e: { kind?: string }) => e.kind === 'cut_corrected')
    expect(entry).toMatchObject({ who: 'Test Operator' })
    expect(entry.note).toContain('minutes 30 to 20')
    expect(entry.note).toContain('Reason: Typed 30 for 20')
  })

  it('a material change uses that material\'s wear factor on the life the cut was logged in', async () => {
    const c = fx.cutters[1]!
    const logId = await cut(shop.operator, c.id, mat.MDF!.id, 60)
    const res = await shop.operator.patch(`/api/cut-logs/${logId}`, { materialId: mat['Aluminium composite panel']!.id, outcome: 'chip_out', reason: 'It was ACM' })
    expect(res.status).toBe(200)
    expect(res.body.cutter.lifeUsed).toBeCloseTo(60 * mat['Aluminium composite panel']!.wearFactor / RATED, 6)
    await expectRollUpsMatchRecount(shop.id)
  })

  it('sent twice, a correction counts once and is recorded once', async () => {
    const c = fx.cutters[2]!
    const logId = await cut(shop.operator, c.id, mat.MDF!.id, 45)
    const body = { minutes: 40, reason: 'Paused for 5 minutes' }
    const [a, b] = await Promise.all([shop.operator.patch(`/api/cut-logs/${logId}`, body), shop.operator.patch(`/api/cut-logs/${logId}`, body)])
    expect([a.status, b.status]).toEqual([200, 200])
    expect(b.body.cutter.minutesTotal).toBe(40)
    const changes = await withDb((db) => db.selectFrom('cut_log_changes').select('id').where('cut_log_id', '=', String(logId)).execute())
    expect(changes).toHaveLength(1)
    await expectRollUpsMatchRecount(shop.id)
  })
})

describe('who may correct', () => {
  it('another operator may not; a crib manager may, after the 24 hours too', async () => {
    const c = fx.cutters[3]!
    const logId = await cut(shop.operator, c.id, mat.MDF!.id, 10)
    const second = new Client()
    const email = `operator2-${randomUUID().slice(0, 6)}@example.com`
    await withDb(async (db) => {
      const hash = await db.selectFrom('users').select('password_hash').where('id', '=', shop.ids.operator).executeTakeFirstOrThrow()
      await db.insertInto('users').values({ shop_id: shop.id, email, name: 'Second Operator', role: 'operator', password_hash: hash.password_hash }).execute()
    })
    await second.login(email, TEST_PASSWORD)
    expect((await second.patch(`/api/cut-logs/${logId}`, { minutes: 5, reason: 'Not mine' })).status).toBe(403)

    await withDb((db) => db.updateTable('cut_logs').set({ created_at: new Date(Date.now() - 25 * 3_600_000) }).where('id', '=', String(logId)).execute())
    const late = await shop.operator.patch(`/api/cut-logs/${logId}`, { minutes: 5, reason: 'Too late' })
    expect(late.status).toBe(403)
    expect(late.body.message).toMatch(/within 24 hours/)
    expect((await shop.crib.patch(`/api/cut-logs/${logId}`, { minutes: 5, reason: 'Checked the job sheet' })).status).toBe(200)
    expect((await shop.owner.post(`/api/cut-logs/${logId}/void`, { reason: 'Test cut' })).status).toBe(200)
  })

  it('another shop\'s log answers 404 and nothing changes', async () => {
    const c = fx.cutters[3]!
    const logId = await cut(shop.operator, c.id, mat.MDF!.id, 10)
    expect((await other.owner.patch(`/api/cut-logs/${logId}`, { minutes: 1, reason: 'Elsewhere' })).status).toBe(404)
    expect((await other.owner.post(`/api/cut-logs/${logId}/void`, { reason: 'Elsewhere' })).status).toBe(404)
    expect((await cutterAndRecount(c.id)).recount.minutesTotal).toBe(10) // the first cut was voided above
  })

  it('no reason, or nothing to change, answers 400 naming the field', async () => {
    const logId = await cut(shop.operator, fx.cutters[3]!.id, mat.MDF!.id, 10)
    const noReason = await shop.operator.patch(`/api/cut-logs/${logId}`, { minutes: 5 })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.fields.reason).toBeDefined()
    const nothing = await shop.operator.patch(`/api/cut-logs/${logId}`, { reason: 'Just because' })
    expect(nothing.status).toBe(400)
  })
})

describe('voiding', () => {
  it('takes the cut out of every total; twice is harmless; a voided log cannot be corrected', async () => {
    const c = fx.cutters[4]!
    const keep = await cut(shop.operator, c.id, mat.HDPE!.id, 50)
    const gone = await cut(shop.operator, c.id, mat.MDF!.id, 25)
    const res = await shop.operator.post(`/api/cut-logs/${gone}/void`, { reason: 'Logged on the wrong bit' })
    expect(res.status).toBe(200)
    expect(res.body.cutter.minutesTotal).toBe(50)
    expect(res.body.cutter.lifeUsed).toBeCloseTo(50 * mat.HDPE!.wearFactor / RATED, 6)
    expect(res.body.cutter.recentCuts.map((r: { id: number }) => r.id)).toEqual([keep])
    const again = await shop.operator.post(`/api/cut-logs/${gone}/void`, { reason: 'Logged on the wrong bit' })
    expect(again.status).toBe(200)
    expect(again.body.cutter.minutesTotal).toBe(50)
    expect((await shop.operator.patch(`/api/cut-logs/${gone}`, { minutes: 3, reason: 'Oops' })).status).toBe(409)
    const history = (await shop.crib.get(`/api/cutters/${c.id}/history`)).body
    expect(history.entries.find((e: { id: string }) => e.id === `c${gone}`).voided).toBe(true)
    await expectRollUpsMatchRecount(shop.id)
  })

  it('never takes life used below zero', async () => {
    const c = fx.cutters[5]!
    const logId = await cut(shop.operator, c.id, mat.MDF!.id, 120)
    // An imported figure smaller than the log's share of life.
    await withDb((db) => db.updateTable('cutters').set({ life_used: 0.05, minutes_this_life: 10 }).where('id', '=', c.id).execute())
    const res = await shop.crib.post(`/api/cut-logs/${logId}/void`, { reason: 'Double entry' })
    expect(res.status).toBe(200)
    expect(res.body.cutter.lifeUsed).toBe(0)
    expect(res.body.cutter.minutesThisLife).toBe(0)
  })
})

describe('a cut on a cutter reground since', () => {
  it('changes that old life\'s figures and the minutes in all lives, not the current life', async () => {
    const c = fx.cutters[0]!
    const old = await cut(shop.operator, c.id, mat.MDF!.id, 100)
    // The cutter comes back from a regrind: a new sharp life at 0.8 of a new one.
    await withDb((db) => db.updateTable('cutters').set({ regrind_count: 1, life_used: 0, minutes_this_life: 0, life_scale: 0.8 }).where('id', '=', c.id).execute())
    await cut(shop.operator, c.id, mat.MDF!.id, 48) // 48 / (600 x 0.8) = 0.1 of this life
    const before = await cutterAndRecount(c.id)
    const res = await shop.crib.patch(`/api/cut-logs/${old}`, { minutes: 70, reason: 'Job sheet says 70' })
    expect(res.status).toBe(200)
    expect(res.body.cutter.lifeUsed).toBeCloseTo(0.1, 6)
    expect(res.body.cutter.minutesThisLife).toBe(48)
    expect(res.body.cutter.minutesTotal).toBe(before.cutter.minutes_total - 30)
    const lives = await withDb((db) => db.selectFrom('cut_sharp_lives').select(['regrind_count', 'minutes']).where('cutter_id', '=', c.id).orderBy('regrind_count').execute())
    expect(lives).toEqual([{ regrind_count: 0, minutes: 20 + 70 }, { regrind_count: 1, minutes: 48 }])
    await expectRollUpsMatchRecount(shop.id)
  })
})

describe('many corrections and voids keep every total equal to a recount', () => {
  it('cutters, daily and sharp-life roll-ups and the reorder demand', async () => {
    const fresh = await makeShop('Recount')
    const f = await addSpindleFixture(fresh.id, 3, RATED)
    const materials = (await fresh.operator.get('/api/materials')).body as Array<{ id: number }>
    for (const c of f.cutters) await fresh.operator.post(`/api/cutters/${c.id}/load`, { machineId: f.machines.changer })
    const logs: number[] = []
    for (let k = 0; k < 18; k++) logs.push(await cut(fresh.operator, f.cutters[k % 3]!.id, materials[k % materials.length]!.id, 5 + k))
    const demandBefore = (await fresh.crib.get('/api/reorder')).body.find((r: { typeId: number }) => r.typeId === f.typeId).dailyDemand
    expect(demandBefore).toBeGreaterThan(0)
    for (let k = 0; k < logs.length; k++) {
      const id = logs[k]!
      if (k % 4 === 0) await fresh.crib.post(`/api/cut-logs/${id}/void`, { reason: `void ${k}` })
      else if (k % 4 === 1) await fresh.crib.patch(`/api/cut-logs/${id}`, { minutes: 1 + k * 2, reason: `minutes ${k}` })
      else if (k % 4 === 2) await fresh.crib.patch(`/api/cut-logs/${id}`, { materialId: materials[(k + 3) % materials.length]!.id, outcome: 'fuzzy', reason: `material ${k}` })
    }
    for (const c of f.cutters) {
      const { cutter, recount } = await cutterAndRecount(c.id)
      expect(cutter.minutes_total).toBeCloseTo(recount.minutesTotal, 2)
      expect(cutter.minutes_this_life).toBeCloseTo(recount.minutesThisLife, 2)
      expect(cutter.life_used).toBeCloseTo(recount.lifeUsed, 6)
    }
    await expectRollUpsMatchRecount(fresh.id)
    // The cut form's "longest logged cut of this type" is the recount's max over the logs still
    // counting: the voided 5-minute log and the corrections that lowered minutes leave no trace.
    const longest = await withDb(async (db) => (await sql<{ minutes: number }>`
      select max(l.minutes)::float8 as minutes from cut_logs l join cutters c on c.id = l.cutter_id
      where l.shop_id = ${fresh.id} and c.type_id = ${f.typeId} and l.voided_at is null`.execute(db)).rows[0]!.minutes)
    const page = (await fresh.operator.get(`/api/cutters/${f.cutters[0]!.id}`)).body
    expect(page.usual.longestCutMinutes).toBe(longest)
    // Demand is lives used per day over 90 days in cutters; recounted from the logs still counting.
    const lives = await withDb(async (db) => (await sql<{ lives: number }>`
      select coalesce(sum(l.minutes * l.wear_factor / t.rated_life_minutes), 0)::float8 as lives
      from cut_logs l join cutters c on c.id = l.cutter_id join cutter_types t on t.id = c.type_id
      where l.shop_id = ${fresh.id} and l.voided_at is null`.execute(db)).rows[0]!.lives)
    const row = (await fresh.crib.get('/api/reorder')).body.find((r: { typeId: number }) => r.typeId === f.typeId)
    expect(row.dailyDemand).toBeCloseTo(lives / 90 / row.livesPerCutter, 9)
    expect(row.dailyDemand).toBeLessThan(demandBefore)
    // A longer log raises it for every cutter of the type.
    const newLongest = longest + 60
    await cut(fresh.operator, f.cutters[1]!.id, materials[0]!.id, newLongest)
    expect((await fresh.operator.get(`/api/cutters/${f.cutters[2]!.id}`)).body.usual.longestCutMinutes).toBe(newLongest)
  })
})
