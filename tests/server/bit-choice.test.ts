// The bit chooser through its route, on the demo shop's twelve cutter types: the trade's rules
// (common practice) rank them, the shop's own logs and cleanup minutes move them, the sharp
// cutters in the crib come with their minutes left, and bad input answers as the issue lists.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { newLabelCode } from '../../shared/kerf/label-code'
import { CUTTER_TYPES } from '../../server/db/seed/demo-data'
import { appDb } from '../support/db'
import type { Client } from '../support/http'
import { makeShop, type TestShop } from '../support/shops'
import { loadCutters } from '../support/spindle'

let shop: TestShop
let other: TestShop
let empty: TestShop
let material: Record<string, { id: number, wear: number }>
let typeIds: Record<string, number>
let cutterOf: Record<string, { fresh: number, used: number }>
let machineId: number

interface Choice {
  typeId: number, typeName: string, fit: 'good' | 'fair' | 'poor', score: number, reasons: string[], sharpInCrib: number
  bestCutter?: { id: number, code: string, lifeUsed: number, remainingMinutes: number }
  results: { logs: number, cleanShare: number | null, cleanupMinutesPerPart: number | null }
  feeds: { rpm: number, feedMmPerMin: number } | null
}

const choose = (client: Client, q: Record<string, number | string | undefined>) =>
  client.get(`/api/bit-choice?${new URLSearchParams(Object.entries(q).filter(([, v]) => v !== undefined).map(([k, v]) => [k, String(v)]))}`)
const nameOf = (key: string) => CUTTER_TYPES.find((t) => t.key === key)!.name
const FIT_ORDER = { good: 0, fair: 1, poor: 2 }

beforeAll(async () => {
  [shop, other, empty] = await Promise.all([makeShop('Bits'), makeShop('Other'), makeShop('No types')])
  const db = appDb()
  try {
    const materials = await db.selectFrom('materials').select(['id', 'name', 'wear_factor']).where('shop_id', '=', shop.id).execute()
    material = Object.fromEntries(materials.map((m) => [m.name, { id: m.id, wear: m.wear_factor }]))
    machineId = (await db.insertInto('machines').values({ shop_id: shop.id, name: 'Router', min_rpm: 6000, max_rpm: 24000 })
      .returning('id').executeTakeFirstOrThrow()).id
    const types = await db.insertInto('cutter_types').values(CUTTER_TYPES.map((t) => ({
      shop_id: shop.id, name: t.name, profile: t.profile, v_angle_deg: t.vAngle, helix: t.helix, flutes: t.flutes,
      cutting_diameter_mm: t.diameter, shank_diameter_mm: t.shank, cutting_length_mm: t.cutLength, overall_length_mm: t.overallLength,
      rated_life_minutes: t.ratedLife, min_usable_diameter_mm: t.minUsable, unit_cost_cents: t.unitCost,
    }))).returning(['id', 'name']).execute()
    typeIds = Object.fromEntries(CUTTER_TYPES.map((t) => [t.key, types.find((x) => x.name === t.name)!.id]))
    // Each type: a fresh cutter, a used one, one flagged dull and one at the regrinder (neither counts as sharp in the crib).
    cutterOf = {}
    for (const t of CUTTER_TYPES) {
      const rows = await db.insertInto('cutters').values([
        { shop_id: shop.id, type_id: typeIds[t.key]!, code: newLabelCode(), diameter_mm: t.diameter, life_used: 0.1 },
        { shop_id: shop.id, type_id: typeIds[t.key]!, code: newLabelCode(), diameter_mm: t.diameter, life_used: 0.5 },
        { shop_id: shop.id, type_id: typeIds[t.key]!, code: newLabelCode(), diameter_mm: t.diameter, flagged: 'dull', flagged_at: new Date() },
        { shop_id: shop.id, type_id: typeIds[t.key]!, code: newLabelCode(), diameter_mm: t.diameter, status: 'at_regrind' },
      ]).returning('id').execute()
      cutterOf[t.key] = { fresh: rows[0]!.id, used: rows[1]!.id }
    }
  } finally {
    await db.destroy()
  }
})

describe('GET /api/bit-choice on the demo shop\'s types', () => {
  it('cutting out cast acrylic: the O-flutes first, the downcuts and compressions last with why, every type listed', async () => {
    const res = await choose(shop.operator, { materialId: material['Cast acrylic']!.id, cut: 'profile', thicknessMm: 6 })
    expect(res.status).toBe(200)
    const list = res.body as Choice[]
    expect(list).toHaveLength(CUTTER_TYPES.length)
    expect(list.slice(0, 2).map((c) => c.typeName).sort()).toEqual([nameOf('of3'), nameOf('of6')].sort())
    expect(list.slice(0, 2).every((c) => c.fit === 'good')).toBe(true)
    for (let i = 1; i < list.length; i++) expect(FIT_ORDER[list[i - 1]!.fit]).toBeLessThanOrEqual(FIT_ORDER[list[i]!.fit])
    for (const key of ['dn6', 'dn10', 'cp6', 'cp10', 'cp13']) {
      const c = list.find((x) => x.typeId === typeIds[key])!
      expect(c.fit, key).toBe('poor')
      expect(c.reasons.join(' '), key).toMatch(/weld/)
    }
    // A two-flute upcut in a hard plastic is poor, and says it melts (PMMA's softening from Callister's appendix).
    const up = list.find((x) => x.typeId === typeIds.up6)!
    expect(up.fit).toBe('poor')
    expect(up.reasons.join(' ')).toContain('softens above about 105 °C')
    // The O-flute's reasons carry the hold-down reminder for a through cut.
    expect(list[0]!.reasons.join(' ')).toMatch(/hold it down/)
  })

  it('counts the sharp cutters in the crib and names the one with the most minutes left in the material', async () => {
    const res = await choose(shop.operator, { materialId: material['Cast acrylic']!.id, cut: 'profile' })
    const of3 = (res.body as Choice[]).find((c) => c.typeId === typeIds.of3)!
    // Flagged dull and at the regrinder do not count: two of four.
    expect(of3.sharpInCrib).toBe(2)
    expect(of3.bestCutter!.id).toBe(cutterOf.of3!.fresh)
    expect(of3.bestCutter!.lifeUsed).toBe(0.1)
    // Remaining minutes = (1 − life used) × rated life / wear factor (Palmgren–Miner, docs/domain.md computation 1).
    const rated = CUTTER_TYPES.find((t) => t.key === 'of3')!.ratedLife
    expect(of3.bestCutter!.remainingMinutes).toBeCloseTo((0.9 * rated) / material['Cast acrylic']!.wear, 1)
  })

  it('cutting out plywood: compression first; a sheet deeper than the flutes puts a bit last as unable to cut through', async () => {
    const ply = material.Plywood!.id
    const at18 = (await choose(shop.crib, { materialId: ply, cut: 'profile', thicknessMm: 18 })).body as Choice[]
    expect(at18[0]!.typeName).toMatch(/compression/)
    expect(at18.find((c) => c.typeId === typeIds.cp6)!.fit).toBe('good')
    // The 1/4" compression has 22.225 mm of flute: 22 mm of sheet plus the 1 mm margin is too much.
    const at22 = (await choose(shop.crib, { materialId: ply, cut: 'profile', thicknessMm: 22 })).body as Choice[]
    const cp6 = at22.find((c) => c.typeId === typeIds.cp6)!
    expect(cp6.fit).toBe('poor')
    expect(cp6.reasons.join(' ')).toContain('cannot cut through')
    expect(at22[0]!.typeName).toMatch(/compression/)
  })

  it('engraving takes the V-bits, 3D surfaces the ball-nose', async () => {
    const engrave = (await choose(shop.operator, { materialId: material.MDF!.id, cut: 'engrave' })).body as Choice[]
    expect(engrave.slice(0, 2).map((c) => c.typeId).sort()).toEqual([typeIds.v60, typeIds.v90].sort())
    expect(engrave[0]!.reasons[0]).toMatch(/included angle of (60|90)°/)
    const carve = (await choose(shop.operator, { materialId: material.MDF!.id, cut: 'surface_3d' })).body as Choice[]
    expect(carve[0]!.typeId).toBe(typeIds.bn6)
  })

  it('gives starting feeds on a chosen machine, and none without one', async () => {
    const withMachine = (await choose(shop.operator, { materialId: material.HDPE!.id, cut: 'pocket', machineId })).body as Choice[]
    const of6 = withMachine.find((c) => c.typeId === typeIds.of6)!
    expect(of6.feeds!.rpm).toBeLessThanOrEqual(24000)
    expect(of6.feeds!.rpm).toBeGreaterThanOrEqual(6000)
    expect(of6.feeds!.feedMmPerMin).toBeGreaterThan(0)
    const without = (await choose(shop.operator, { materialId: material.HDPE!.id, cut: 'pocket' })).body as Choice[]
    expect(without.every((c) => c.feeds === null)).toBe(true)
  })

  it('lets the shop\'s own results move a type once enough logs back them, with the cleanup minutes logged on the phone', async () => {
    const hdpe = material.HDPE!
    const before = (await choose(shop.operator, { materialId: hdpe.id, cut: 'profile' })).body as Choice[]
    const up6Before = before.find((c) => c.typeId === typeIds.up6)!
    expect([up6Before.fit, up6Before.results]).toEqual(['fair', { logs: 0, cleanShare: null, cleanupMinutesPerPart: null }])

    // Two cut logs through the route, each with the cleanup minutes a part cost, on the cutter
    // loaded into the machine (a cut is logged only on a loaded cutter).
    await loadCutters(shop.operator, [cutterOf.up6!.used], machineId)
    for (const [outcome, cleanup] of [['fuzzy', 12], ['fuzzy', 8]] as const) {
      const res = await shop.operator.post(`/api/cutters/${cutterOf.up6!.used}/cuts`, {
        idempotencyKey: randomUUID(), materialId: hdpe.id, minutes: 10, outcome, cleanupMinutesPerPart: cleanup,
      })
      expect(res.status).toBe(201)
      expect(res.body.log.cleanupMinutesPerPart).toBe(cleanup)
    }
    const few = ((await choose(shop.operator, { materialId: hdpe.id, cut: 'profile' })).body as Choice[]).find((c) => c.typeId === typeIds.up6)!
    // (13 + 0) / (20 + 2) = 0.591: still the rules' fair fit.
    expect(few.fit).toBe('fair')
    expect(few.score).toBe(59.1)
    expect(few.results).toEqual({ logs: 2, cleanShare: 0, cleanupMinutesPerPart: 10 })
    expect(few.reasons.at(-1)).toBe('This shop: 0 % of 2 logged cuts in HDPE came out clean; cleanup averaged 10 min a part over 2 logs.')

    // Then 78 clean cuts written as a bulk import would (the roll-up trigger counts them).
    const db = appDb()
    try {
      await db.insertInto('cut_logs').values(Array.from({ length: 78 }, () => ({
        shop_id: shop.id, cutter_id: cutterOf.up6!.used, material_id: hdpe.id, minutes: 5, wear_factor: hdpe.wear, life_added: 0.0001,
        outcome: 'clean' as const, idempotency_key: randomUUID(),
      }))).execute()
    } finally {
      await db.destroy()
    }
    const many = ((await choose(shop.operator, { materialId: hdpe.id, cut: 'profile' })).body as Choice[]).find((c) => c.typeId === typeIds.up6)!
    // (13 + 78) / (20 + 80) = 0.91: good now, and said so.
    expect(many.fit).toBe('good')
    expect(many.score).toBe(91)
    expect(many.results).toEqual({ logs: 80, cleanShare: 0.975, cleanupMinutesPerPart: 10 })
    expect(many.reasons.at(-1)).toMatch(/lifts it above the rules' fit/)
  })
})

describe('GET /api/bit-choice: bad input and an empty catalogue', () => {
  it('answers 404 for a material or machine not in the shop', async () => {
    const otherMaterial = ((await other.operator.get('/api/materials')).body as Array<{ id: number }>)[0]!.id
    for (const q of [{ materialId: otherMaterial }, { materialId: 2_000_000_000 }]) {
      const res = await choose(shop.operator, { ...q, cut: 'profile' })
      expect(res.status).toBe(404)
      expect(res.body.message).toContain('No such material')
    }
    const res = await choose(shop.operator, { materialId: material.MDF!.id, cut: 'profile', machineId: 2_000_000_000 })
    expect(res.status).toBe(404)
    expect(res.body.message).toContain('No such machine')
  })

  it('answers 400 naming the thickness for 0 or over 300 mm, and the cut when it is missing', async () => {
    for (const thicknessMm of [0, 300.5, -3, 'thick']) {
      const res = await choose(shop.operator, { materialId: material.MDF!.id, cut: 'profile', thicknessMm })
      expect(res.status, String(thicknessMm)).toBe(400)
      expect(res.body.message).toMatch(/^thicknessMm: /)
      expect(res.body.data.fields.thicknessMm).toBeTruthy()
    }
    expect((await choose(shop.operator, { materialId: material.MDF!.id, cut: 'profile', thicknessMm: 300 })).status).toBe(200)
    const noCut = await choose(shop.operator, { materialId: material.MDF!.id })
    expect(noCut.status).toBe(400)
    expect(noCut.body.data.fields.cut).toMatch(/choose profile/)
  })

  it('answers an empty list for a shop with no cutter types', async () => {
    const mdf = ((await empty.operator.get('/api/materials')).body as Array<{ id: number, name: string }>).find((m) => m.name === 'MDF')!
    const res = await choose(empty.operator, { materialId: mdf.id, cut: 'profile' })
    expect(res.status).toBe(200)
    expect(res.body).toEqual([])
  })
})

describe('the owner\'s cleanup table', () => {
  it('shows outcomes and cleanup minutes by type and material, in money once the owner sets a labour rate', async () => {
    const before = await shop.owner.get('/api/insights/cleanup')
    expect(before.status).toBe(200)
    expect(before.body.labourRateCentsPerHour).toBeNull()
    const row = (body: { rows: Array<{ typeId: number, materialName: string }> }) => body.rows.find((r) => r.typeId === typeIds.up6 && r.materialName === 'HDPE')
    expect(row(before.body)).toMatchObject({ logs: 80, clean: 78, fuzzy: 2, cleanupLogs: 2, cleanupMinutesPerPart: 10, cleanupCentsPerPart: null })

    const set = await shop.owner.patch('/api/shop', { labourRateCentsPerHour: 4200 })
    expect(set.status).toBe(200)
    expect(set.body.labourRateCentsPerHour).toBe(4200)
    const after = await shop.owner.get('/api/insights/cleanup')
    // 10 min a part at $42.00 an hour = $7.00 a part, worked by hand.
    expect(row(after.body)).toMatchObject({ cleanupMinutesPerPart: 10, cleanupCentsPerPart: 700 })
    expect(after.body.rows[0].typeId).toBe(typeIds.up6)

    expect((await shop.owner.patch('/api/shop', { labourRateCentsPerHour: -1 })).body.data.fields.labourRateCentsPerHour).toBeTruthy()
    expect((await shop.crib.get('/api/insights/cleanup')).status).toBe(403)
  })
})
