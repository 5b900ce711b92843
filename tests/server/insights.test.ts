// Owner insights: the roll-ups agree with the raw cut logs written through the spindle route,
// tooling cost per cut-hour matches figures worked by hand, learned wear comes from finished
// lives only and can be adopted, and nobody sees another shop's cutting or a room above their role.
import { randomUUID } from 'node:crypto'
import { sql } from 'kysely'
import { beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import type { Client } from '../support/http'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, loadCutters, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let other: TestShop
let fx: SpindleFixture
let otherFx: SpindleFixture
let mat: Record<string, number>

// The fixture type: rated 600 min, $30.00 new; here $10.00 a regrind, 2 regrinds, fraction 0.8:
// one life costs (3000 + 2 × 1000) / 2.6 = 1923.08 cents.
const cut = (client: Client, cutterId: number, body: Record<string, unknown>) =>
  client.post(`/api/cutters/${cutterId}/cuts`, { idempotencyKey: `test-${randomUUID()}`, outcome: 'clean', ...body })

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Insights'), makeShop('Elsewhere')])
  ;[fx, otherFx] = await Promise.all([addSpindleFixture(shop.id, 4), addSpindleFixture(other.id, 2)])
  const db = appDb()
  await db.updateTable('cutter_types').set({ regrind_cost_cents: 1000 }).where('shop_id', 'in', [shop.id, other.id]).execute()
  await db.destroy()
  const list = (await shop.operator.get('/api/materials')).body as Array<{ id: number, name: string }>
  mat = Object.fromEntries(list.map((m) => [m.name, m.id]))
  const [c0, c1, c2] = fx.cutters
  const { changer, single } = fx.machines
  await loadCutters(shop.operator, [c0!.id], changer)
  await loadCutters(shop.operator, [c1!.id], single)
  await loadCutters(other.operator, [otherFx.cutters[0]!.id], otherFx.machines.changer)
  // c2's cut waited on a phone and arrives after the bit went back to the crib: it is logged at
  // the time it was cut (while loaded), with no machine recorded.
  await loadCutters(shop.operator, [c2!.id], changer)
  await new Promise((r) => setTimeout(r, 30))
  const c2CutAt = new Date().toISOString()
  await new Promise((r) => setTimeout(r, 30))
  expect((await shop.operator.post(`/api/cutters/${c2!.id}/return`)).status).toBe(200)
  const logs = [
    cut(shop.operator, c0!.id, { materialId: mat.MDF, minutes: 120, machineId: changer }),
    cut(shop.operator, c0!.id, { materialId: mat['Cast acrylic'], minutes: 60, machineId: changer, outcome: 'melted' }),
    cut(shop.operator, c0!.id, { materialId: mat['Aluminium composite panel'], minutes: 90, machineId: changer, outcome: 'chip_out' }),
    cut(shop.operator, c1!.id, { materialId: mat.MDF, minutes: 30, machineId: single, outcome: 'fuzzy' }),
    cut(shop.operator, c2!.id, { materialId: mat.MDF, minutes: 300, cutAt: c2CutAt }),
  ]
  for (const res of await Promise.all(logs)) expect(res.status).toBe(201)
  expect((await cut(shop.operator, c1!.id, { materialId: mat.HDPE, minutes: 45, machineId: single, outcome: 'broken' })).status).toBe(201)
  // c2's life ends dull after 300 min of MDF at rated 600: that life says MDF wears at 2.0.
  expect((await shop.operator.post(`/api/cutters/${c2!.id}/flag`, { kind: 'dull' })).status).toBe(200)
  // The other shop cuts a lot of MDF; none of it may count here.
  const otherMdf = ((await other.operator.get('/api/materials')).body as Array<{ id: number, name: string }>).find((m) => m.name === 'MDF')!.id
  expect((await cut(other.operator, otherFx.cutters[0]!.id, { materialId: otherMdf, minutes: 500 })).status).toBe(201)
})

describe('who may read insights', () => {
  const OWNER_ONLY = ['/api/insights/cost?by=material', '/api/insights/spend', '/api/insights/outcomes']

  // Each route's 401 and 403 are the route table's (routes.test.ts); here, what a crib manager is told.
  it('tells crib managers that the cost pages are the owner\'s', async () => {
    for (const path of OWNER_ONLY) {
      const res = await shop.crib.get(path)
      expect(res.body.message).toMatch(/owner role/)
    }
    expect((await shop.crib.get('/api/insights/wear')).status).toBe(200)
    for (const path of OWNER_ONLY) expect((await shop.owner.get(path)).status).toBe(200)
  })

  it('names the bad field of a query', async () => {
    const bad = await shop.owner.get('/api/insights/cost?by=colour')
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.by).toBeTruthy()
    const backwards = await shop.owner.get('/api/insights/spend?from=2026-05-02&to=2026-05-01')
    expect(backwards.status).toBe(400)
    expect(backwards.body.data.fields.to).toMatch(/on or after/)
    expect((await shop.owner.get('/api/insights/outcomes?from=yesterday')).status).toBe(400)
  })
})

/** The roll-ups summed by material and by life, beside the same sums over the raw logs. */
async function rollUpsAgainstRaw() {
  const db = appDb()
  try {
    const daily = await sql`
      select material_id, sum(logs)::int as logs, sum(minutes) as minutes, round(sum(new_lives), 6) as new_lives, sum(broken)::int as broken
      from cut_log_daily where shop_id = ${shop.id} group by material_id order by material_id`.execute(db)
    const raw = await sql`
      select material_id, count(*)::int as logs, sum(minutes) as minutes, round(sum(minutes * wear_factor / 600), 6) as new_lives,
        (count(*) filter (where outcome = 'broken'))::int as broken
      from cut_logs where shop_id = ${shop.id} group by material_id order by material_id`.execute(db)
    const lives = await sql`
      select cutter_id, regrind_count, logs, minutes, round(sharp_share, 6) as share, material_minutes
      from cut_sharp_lives where shop_id = ${shop.id} order by 1, 2`.execute(db)
    const rawLives = await sql`
      select cutter_id, regrind_count, sum(logs)::int as logs, sum(minutes) as minutes, round(sum(share), 6) as share,
        jsonb_object_agg(material_id::text, minutes) as material_minutes
      from (
        select cutter_id, regrind_count, material_id, count(*) as logs, sum(minutes) as minutes, sum(life_added / wear_factor) as share
        from cut_logs where shop_id = ${shop.id} group by 1, 2, 3
      ) by_material
      group by 1, 2 order by 1, 2`.execute(db)
    return { daily: daily.rows, raw: raw.rows, lives: lives.rows, rawLives: rawLives.rows }
  } finally {
    await db.destroy()
  }
}

describe('the roll-ups', () => {
  it('agree with the raw cut logs written through the spindle route', async () => {
    const { daily, raw, lives, rawLives } = await rollUpsAgainstRaw()
    expect(daily).toEqual(raw)
    expect(daily.length).toBe(4)
    expect(lives).toEqual(rawLives)
    // A life that cut more than one material keeps each material's minutes apart.
    expect(lives.some((l) => Object.keys((l as { material_minutes: object }).material_minutes).length > 1)).toBe(true)
  })
})

describe('tooling cost per cut-hour', () => {
  it('by material, worked by hand', async () => {
    const res = await shop.owner.get('/api/insights/cost?by=material')
    expect(res.status).toBe(200)
    // Lives used × 1923.08 cents: composite 90 × 1.6 / 600 = 0.24 → 461.54 over 1.5 h = 307.69/h;
    // MDF 450 × 1.0 / 600 = 0.75 → 1442.31 over 7.5 h = 192.31/h; cast acrylic 60 × 0.9 / 600 = 0.09
    // → 173.08 over 1 h; HDPE 45 × 0.6 / 600 = 0.045 → 86.54 over 0.75 h = 115.38/h.
    expect(res.body.rows).toEqual([
      { key: mat['Aluminium composite panel'], name: 'Aluminium composite panel', cutHours: 1.5, toolingCostCents: 462, costPerCutHourCents: 308 },
      { key: mat.MDF, name: 'MDF', cutHours: 7.5, toolingCostCents: 1442, costPerCutHourCents: 192 },
      { key: mat['Cast acrylic'], name: 'Cast acrylic', cutHours: 1, toolingCostCents: 173, costPerCutHourCents: 173 },
      { key: mat.HDPE, name: 'HDPE', cutHours: 0.75, toolingCostCents: 87, costPerCutHourCents: 115 },
    ])
  })

  it('by machine, with cuts logged off any machine in a row of their own', async () => {
    const rows = (await shop.owner.get('/api/insights/cost?by=machine')).body.rows as Array<{ name: string, cutHours: number }>
    expect(Object.fromEntries(rows.map((r) => [r.name, r.cutHours]))).toEqual({
      'Big table with changer': 4.5, 'Small router': 1.25, 'No machine recorded': 5,
    })
    const people = (await shop.owner.get('/api/insights/cost?by=operator')).body.rows
    expect(people).toEqual([expect.objectContaining({ key: shop.ids.operator, name: 'Test Operator', cutHours: 10.75, toolingCostCents: 2163 })])
  })

  it('counts only the range asked for, and never another shop\'s cutting', async () => {
    expect((await shop.owner.get('/api/insights/cost?from=2020-01-01&to=2020-12-31')).body.rows).toEqual([])
    const theirs = (await other.owner.get('/api/insights/cost?by=type')).body.rows
    expect(theirs).toEqual([expect.objectContaining({ key: otherFx.typeId, cutHours: 8.33 })])
  })
})

describe('spend and outcomes', () => {
  it('counts cutters received at their catalogue price in the month they came', async () => {
    const months = (await shop.owner.get('/api/insights/spend')).body.months as Array<{ month: string, newCents: number, regrindCents: number }>
    expect(months.length).toBeGreaterThanOrEqual(12)
    expect(months.at(-1)).toMatchObject({ month: new Date().toISOString().slice(0, 7), newCents: 4 * 3000, regrindCents: 0, cuttersBought: 4 })
    expect(months.reduce((s, m) => s + m.newCents, 0)).toBe(12000)
  })

  it('tallies outcomes by material and profile, with the breakage rate', async () => {
    const res = (await shop.owner.get('/api/insights/outcomes')).body
    expect(res).toMatchObject({ logs: 6, broken: 1 })
    expect(res.breakageRate).toBeCloseTo(1 / 6, 9)
    expect(res.byMaterial.find((r: { name: string }) => r.name === 'MDF')).toMatchObject({ logs: 3, clean: 2, fuzzy: 1, broken: 0, cutHours: 7.5 })
    expect(res.byProfile).toEqual([expect.objectContaining({ key: 'square_end', logs: 6, melted: 1, fuzzy: 1, chipOut: 1, broken: 1 })])
  })
})

describe('learned wear', () => {
  it('reads every life: worn-out ones as failures, still-sharp and broken ones as censored; MDF is the unit', async () => {
    const res = await shop.crib.get('/api/insights/wear')
    expect(res.status).toBe(200)
    const by = Object.fromEntries(res.body.materials.map((m: { name: string }) => [m.name, m]))
    // MDF (starting factor 1, the first such) is the reference: c2's life ended dull after 300 min
    // of MDF at a rated 600, so it speaks about the type's rated life, not about MDF.
    expect(res.body.referenceMaterialId).toBe(mat.MDF)
    expect(by.MDF).toMatchObject({ startingFactor: 1, learnedFactor: 1, lives: 3, finishedLives: 1, censoredLives: 2, minutes: 450, group: [] })
    expect(by.MDF.flags[0]).toMatch(/^The reference material/)
    // c1 broke after 45 min of HDPE: censored, so HDPE keeps close to its figure, with a wide interval.
    expect(by.HDPE).toMatchObject({ startingFactor: 0.6, lives: 1, finishedLives: 0, censoredLives: 1 })
    expect(by.HDPE.interval[0]).toBeLessThan(by.HDPE.learnedFactor)
    expect(by.HDPE.interval[1]).toBeGreaterThan(by.HDPE.learnedFactor)
    expect(by.HDPE.flags).toContain('Too few lives: 0 lives ended by wear (5 make a fair figure).')
    expect(by.Softwood).toMatchObject({ lives: 0, learnedFactor: 0.7, interval: null, flags: ['No lives cut it in these dates: the starting figure stands.'] })
    // Cast acrylic and aluminium composite panel were only ever cut on c0, 60 : 90: always together.
    expect(by['Cast acrylic'].group).toEqual([{ materialId: mat['Aluminium composite panel'], name: 'Aluminium composite panel' }])
    expect(by['Cast acrylic'].flags).toContain('Cannot be told apart from Aluminium composite panel: always cut together.')
    // The one type: its lives were read against the rated 600 min; one dull life at 300 min pulls its ratio below 1.
    expect(res.body.types).toHaveLength(1)
    expect(res.body.types[0]).toMatchObject({ typeId: fx.typeId, ratedLifeMinutes: 600, finishedLives: 1, censoredLives: 2 })
    expect(res.body.types[0].ratedLifeRatio).toBeLessThan(1)
    expect(res.body.scatter).toBeGreaterThan(0)
  })

  it('adopting a figure with a wide interval asks first; confirmed, it writes the factor, records who, and leaves past logs', async () => {
    // c3 wears out after 200 min of HDPE, a third of its rated life at the figure in use: one
    // life, so HDPE moves toward the data, with a wide interval. A cut is logged on a loaded cutter.
    await loadCutters(shop.operator, [fx.cutters[3]!.id], fx.machines.changer)
    expect((await cut(shop.operator, fx.cutters[3]!.id, { materialId: mat.HDPE, minutes: 200 })).status).toBe(201)
    expect((await shop.operator.post(`/api/cutters/${fx.cutters[3]!.id}/flag`, { kind: 'dull' })).status).toBe(200)
    const asked = await shop.crib.post('/api/insights/wear/adopt', { materialIds: [mat.MDF, mat.HDPE] })
    expect(asked.status).toBe(409)
    expect(asked.body.message).toMatch(/HDPE .* uncertain: confirm to adopt anyway/)
    const learned = ((await shop.crib.get('/api/insights/wear')).body.materials as Array<{ name: string, learnedFactor: number }>).find((m) => m.name === 'HDPE')!.learnedFactor
    expect(learned).toBeGreaterThan(0.6)
    const res = await shop.crib.post('/api/insights/wear/adopt', { materialIds: [mat.MDF, mat.HDPE], confirmWide: true })
    expect(res.status).toBe(200)
    // MDF, the reference, never changes.
    expect(res.body.adopted).toEqual([{ materialId: mat.HDPE, name: 'HDPE', from: 0.6, to: learned, lives: 2 }])
    expect(res.body.message).toMatch(/1 left as they were/)
    const db = appDb()
    try {
      const m = await db.selectFrom('materials').select('wear_factor').where('id', '=', mat.HDPE!).executeTakeFirstOrThrow()
      expect(m.wear_factor).toBe(learned)
      const record = await db.selectFrom('wear_factor_adoptions').selectAll().where('shop_id', '=', shop.id).execute()
      expect(record).toEqual([expect.objectContaining({ material_id: mat.HDPE, from_factor: 0.6, to_factor: learned, lives: 2, adopted_by: shop.ids.crib })])
      const old = await db.selectFrom('cut_logs').select('wear_factor').where('shop_id', '=', shop.id).where('material_id', '=', mat.HDPE!).execute()
      expect(old.every((l) => l.wear_factor === 0.6)).toBe(true)
    } finally {
      await db.destroy()
    }
    const next = await cut(shop.operator, fx.cutters[0]!.id, { materialId: mat.HDPE, minutes: 60 })
    expect(next.body.log.wearFactor).toBe(learned)
  })

  it('answers 404 for another shop\'s material', async () => {
    const theirs = ((await other.owner.get('/api/insights/wear')).body.materials as Array<{ materialId: number }>)[0]!.materialId
    expect((await shop.owner.post('/api/insights/wear/adopt', { materialIds: [theirs] })).status).toBe(404)
    expect((await shop.crib.post('/api/insights/wear/adopt', { materialIds: [] })).status).toBe(400)
  })
})

describe('the roll-ups, later', () => {
  it('still agree after more logs land on the same day, material, operator and (no) machine', async () => {
    for (const minutes of [15, 25]) expect((await cut(shop.operator, fx.cutters[0]!.id, { materialId: mat.Softwood, minutes })).status).toBe(201)
    const { daily, raw, lives, rawLives } = await rollUpsAgainstRaw()
    expect(daily).toEqual(raw)
    expect(lives).toEqual(rawLives)
    expect(raw.find((r) => (r as { material_id: number }).material_id === mat.Softwood)).toMatchObject({ logs: 2, minutes: 40 })
  })
})
