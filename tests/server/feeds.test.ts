// Feeds and speeds through the route: the answer's shape and figures, clamping to the machine,
// the single-flute-in-the-crib warning and the learned nudge from real rows, the shop's own
// chip-load table, and the tenancy and role rules.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { newLabelCode } from '../../shared/kerf/label-code'
import { withDb } from '../support/db'
import type { Client } from '../support/http'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, loadCutters, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let other: TestShop
let fx: SpindleFixture
let otherFx: SpindleFixture
let material: Record<string, number>
let machines: { slow: number, fast: number }

const feeds = (client: Client, q: Record<string, number | string | undefined>) =>
  client.get(`/api/feeds?${new URLSearchParams(Object.entries(q).filter(([, v]) => v !== undefined).map(([k, v]) => [k, String(v)]))}`)

/** A cutter type of the shop, with cutters in the given statuses. */
async function addType(shopId: number, t: { name: string, flutes: number, helix: 'upcut' | 'downcut', profile: 'o_flute' | 'square_end', diameter: number }, statuses: Array<'in_crib' | 'at_regrind'>) {
  return withDb(async (db) => {
    const type = await db.insertInto('cutter_types').values({
      shop_id: shopId, name: t.name, profile: t.profile, helix: t.helix, flutes: t.flutes, cutting_diameter_mm: t.diameter,
      shank_diameter_mm: t.diameter, cutting_length_mm: 22, overall_length_mm: 64, rated_life_minutes: 600,
      min_usable_diameter_mm: t.diameter - 0.3, unit_cost_cents: 3000,
    }).returning('id').executeTakeFirstOrThrow()
    const cutters = statuses.length
      ? await db.insertInto('cutters').values(statuses.map((status) => ({ shop_id: shopId, type_id: type.id, code: newLabelCode(), diameter_mm: t.diameter, status })))
          .returning('id').execute()
      : []
    return { typeId: type.id, cutterIds: cutters.map((c) => c.id) }
  })
}

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Feeds'), makeShop('Elsewhere')])
  ;[fx, otherFx] = await Promise.all([addSpindleFixture(shop.id, 6), addSpindleFixture(other.id, 1)])
  const list = (await shop.operator.get('/api/materials')).body as Array<{ id: number, name: string }>
  material = Object.fromEntries(list.map((m) => [m.name, m.id]))
  machines = await withDb(async (db) => {
    const [slow, fast] = await db.insertInto('machines').values([
      { shop_id: shop.id, name: 'Slow spindle', min_rpm: 4000, max_rpm: 12000 },
      { shop_id: shop.id, name: 'Fast spindle', min_rpm: 20000, max_rpm: 40000 },
    ]).returning('id').execute()
    return { slow: slow!.id, fast: fast!.id }
  })
})

describe('GET /api/feeds', () => {
  it('answers the starting settings, the warnings and the cautions', async () => {
    // Two-flute upcut 1/4" (6.35 mm) in MDF, sheet goods at 1/4 in: 0.012–0.016 in = 0.3048–0.4064 mm.
    const res = await feeds(shop.operator, { typeId: fx.typeId, materialId: material.MDF, machineId: fx.machines.changer })
    expect(res.status).toBe(200)
    const r = res.body
    for (const key of ['rpm', 'chipLoadMm', 'feedMmPerMin', 'feedInPerMin', 'surfaceSpeedMPerMin', 'plungeMmPerMin', 'depthPerPassMm']) {
      expect(typeof r[key]).toBe('number')
    }
    // 1000 × 359 / (π × 6.35) = 17,996 rpm; 17,996 × 2 × 0.3556 = 12,798.8 mm/min = 503.9 in/min.
    expect(r).toMatchObject({ rpm: 17996, chipLoadMm: 0.3556, warnings: [], learned: null, rpmClamped: null })
    expect(r.feedMmPerMin).toBeCloseTo(12798.8, 1)
    expect(r.feedInPerMin).toBeCloseTo(503.9, 1)
    expect(r.surfaceSpeedMPerMin).toBeCloseTo(359, 0)
    expect(r.plungeMmPerMin).toBeCloseTo(12798.8 * 0.5, 0)
    expect(r.depthPerPassMm).toBeCloseTo(6.35, 2)
    expect(r.band).toMatchObject({ label: '3/16 to 5/16 in', outside: null })
    expect(r.band.source).toMatch(/common practice/)
    expect(r.cautions).toHaveLength(6)
    expect(r.cautions.join(' ')).toMatch(/bit maker's data, the machine's manual and local codes govern/)
  })

  it('clamps the spindle speed to the machine\'s range', async () => {
    const q = { typeId: fx.typeId, materialId: material.MDF }
    const top = (await feeds(shop.operator, { ...q, machineId: machines.slow })).body
    expect(top).toMatchObject({ rpm: 12000, rpmClamped: 'max', warnings: [] })
    expect(top.feedMmPerMin).toBeCloseTo(12000 * 2 * 0.3556, 1)
    expect(top.notes.join(' ')).toMatch(/tops out at 12,000 rpm/)
    const floor = (await feeds(shop.operator, { ...q, machineId: machines.fast })).body
    expect(floor).toMatchObject({ rpm: 20000, rpmClamped: 'min' })
    expect(floor.warnings.map((w: { code: string }) => w.code)).toEqual(['spindle_out_of_range'])
  })

  it('reduces the chip load for a deep cut and warns when it falls below the range', async () => {
    const q = { typeId: fx.typeId, materialId: material.MDF, machineId: fx.machines.changer }
    const deep = (await feeds(shop.operator, { ...q, depthMm: 12.7 })).body
    // 0.3556 × 0.75 = 0.2667 < 0.3048: the edge would rub.
    expect(deep.chipLoadMm).toBeCloseTo(0.2667, 4)
    expect(deep.warnings.map((w: { code: string }) => w.code)).toContain('chip_load_low')
  })

  it('uses the cutter\'s own diameter and warns about a worn bit in hard plastic', async () => {
    const [worn] = fx.cutters
    await withDb((db) => db.updateTable('cutters').set({ diameter_mm: 6.1, life_used: 0.9 }).where('id', '=', worn!.id).execute())
    const r = (await feeds(shop.operator, { typeId: fx.typeId, materialId: material['Cast acrylic'], machineId: fx.machines.changer, cutterId: worn!.id })).body
    expect(r.diameterMm).toBe(6.1)
    expect(r.rpm).toBe(Math.round(359000 / (Math.PI * 6.1)))
    expect(r.warnings.map((w: { code: string }) => w.code)).toContain('dull_in_hard_plastic')
    const fresh = (await feeds(shop.operator, { typeId: fx.typeId, materialId: material['Cast acrylic'], machineId: fx.machines.changer, cutterId: fx.cutters[1]!.id })).body
    expect(fresh.warnings.map((w: { code: string }) => w.code)).not.toContain('dull_in_hard_plastic')
  })

  it('refuses a cutter of another type with a 400 naming the field', async () => {
    const { cutterIds } = await addType(shop.id, { name: 'Downcut 1/8"', flutes: 2, helix: 'downcut', profile: 'square_end', diameter: 3.175 }, ['in_crib'])
    const res = await feeds(shop.operator, { typeId: fx.typeId, materialId: material.MDF, machineId: fx.machines.changer, cutterId: cutterIds[0] })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.cutterId).toMatch(/another cutter type/)
  })

  it('answers 400 naming each missing or bad field', async () => {
    const res = await feeds(shop.operator, { typeId: 'abc', materialId: material.MDF, depthMm: -2 })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(['depthMm', 'machineId', 'typeId'])
  })

  it('answers 404 for another shop\'s type, material, machine or cutter, and 401 without a session', async () => {
    const theirMaterial = (await other.operator.get('/api/materials')).body[0].id
    const mine = { typeId: fx.typeId, materialId: material.MDF, machineId: fx.machines.changer }
    for (const [q, what] of [
      [{ ...mine, typeId: otherFx.typeId }, 'cutter type'],
      [{ ...mine, materialId: theirMaterial }, 'material'],
      [{ ...mine, machineId: otherFx.machines.changer }, 'machine'],
      [{ ...mine, cutterId: otherFx.cutters[0]!.id }, 'cutter'],
    ] as const) {
      const res = await feeds(shop.operator, q)
      expect(res.status).toBe(404)
      expect(res.body.message).toBe(`No such ${what} in your shop.`)
    }
  })
})

describe('a two-flute bit in plastic when a single-flute bit of its diameter is in the crib', () => {
  it('warns only when such a bit of this shop is in the crib', async () => {
    const q = { typeId: fx.typeId, materialId: material.HDPE, machineId: fx.machines.changer }
    const codes = async () => (await feeds(shop.operator, q)).body.warnings.map((w: { code: string }) => w.code)
    // Another shop's single-flute 1/4" in its crib does not count, nor does one of ours at the regrinder,
    // nor a single-flute downcut or one of another diameter.
    await addType(other.id, { name: 'O-flute 1/4" elsewhere', flutes: 1, helix: 'upcut', profile: 'o_flute', diameter: 6.35 }, ['in_crib'])
    const ours = await addType(shop.id, { name: 'O-flute upcut 1/4"', flutes: 1, helix: 'upcut', profile: 'o_flute', diameter: 6.35 }, ['at_regrind'])
    await addType(shop.id, { name: 'Single downcut 1/4"', flutes: 1, helix: 'downcut', profile: 'square_end', diameter: 6.35 }, ['in_crib'])
    await addType(shop.id, { name: 'O-flute upcut 1/8"', flutes: 1, helix: 'upcut', profile: 'o_flute', diameter: 3.175 }, ['in_crib'])
    expect(await codes()).not.toContain('single_flute_in_crib')

    await withDb((db) => db.updateTable('cutters').set({ status: 'in_crib' }).where('id', '=', ours.cutterIds[0]!).execute())
    const res = await feeds(shop.operator, q)
    const warning = res.body.warnings.find((w: { code: string }) => w.code === 'single_flute_in_crib')
    expect(warning.message).toContain('O-flute upcut 1/4"')
    // The single-flute bit itself gets no such warning, and neither does the two-flute one in wood.
    expect((await feeds(shop.operator, { ...q, typeId: ours.typeId })).body.warnings).toEqual([])
    expect((await feeds(shop.operator, { ...q, materialId: material.MDF })).body.warnings).toEqual([])
  })
})

describe('the learned nudge from the shop\'s own cut logs', () => {
  it('shows what the clean cuts of the same type and material ran at, once melted cuts are on record', async () => {
    const cutterId = fx.cutters[2]!.id
    const q = { typeId: fx.typeId, materialId: material.Polycarbonate, machineId: fx.machines.changer }
    const log = (outcome: string, rpm: number | undefined, feedMmPerMin: number | undefined, materialId = material.Polycarbonate) =>
      shop.operator.post(`/api/cutters/${cutterId}/cuts`, { idempotencyKey: `test-${randomUUID()}`, materialId, minutes: 5, outcome, rpm, feedMmPerMin })

    await loadCutters(shop.operator, [cutterId], fx.machines.changer)
    for (const [rpm, feed] of [[18000, 3000], [16000, 2800], [18000, 3600]] as const) expect((await log('clean', rpm, feed)).status).toBe(201)
    expect((await feeds(shop.operator, q)).body.learned).toBeNull()

    await log('melted', 24000, 1200)
    await log('fuzzy', 22000, 1000)
    await log('melted', undefined, undefined) // no settings: not counted
    await log('melted', 24000, 900, material.HDPE) // another material: not counted
    const learned = (await feeds(shop.operator, q)).body.learned
    expect(learned.bad).toMatchObject({ count: 2, rpm: 23000, feedMmPerMin: 1100 })
    // Middle of the clean cuts: 18,000 rpm, 3,000 mm/min; chip loads 0.0833, 0.0875, 0.1 → 0.0875 per tooth (two flutes).
    expect(learned.clean).toMatchObject({ count: 3, rpm: 18000, feedMmPerMin: 3000, chipLoadMm: 0.0875 })
  })
})

describe('the shop\'s chip-load table', () => {
  it('starts with three bands for every family at sign-up', async () => {
    const rows = (await shop.operator.get('/api/chip-loads')).body
    expect(rows).toHaveLength(21)
    expect(rows.find((r: { family: string, label: string }) => r.family === 'hard_plastic' && r.label === '3/16 to 5/16 in'))
      .toMatchObject({ chipLoadMinMm: 0.127, chipLoadMaxMm: 0.2286, surfaceSpeedMPerMin: 359 })
  })

  it('the crib manager edits a row and the feeds follow', async () => {
    const rows = (await shop.crib.get('/api/chip-loads')).body
    const row = rows.find((r: { family: string, label: string }) => r.family === 'foam' && r.label === '3/16 to 5/16 in')
    const res = await shop.crib.patch(`/api/chip-loads/${row.id}`, { chipLoadMinMm: 0.2, chipLoadMaxMm: 0.3, surfaceSpeedMPerMin: null, source: 'Our own trials, 2026' })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ chipLoadMinMm: 0.2, chipLoadMaxMm: 0.3, surfaceSpeedMPerMin: null, source: 'Our own trials, 2026' })
    const r = (await feeds(shop.operator, { typeId: fx.typeId, materialId: material['PVC foam board'], machineId: fx.machines.changer })).body
    expect(r).toMatchObject({ rpm: 24000, rpmTarget: null, chipLoadMm: 0.25 })
  })

  it('refuses a range whose smallest is above its largest, and another shop\'s row', async () => {
    const rows = (await shop.crib.get('/api/chip-loads')).body
    const bad = await shop.crib.patch(`/api/chip-loads/${rows[0].id}`, { chipLoadMinMm: 5 })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.chipLoadMinMm).toBeTruthy()
    expect((await shop.crib.patch(`/api/chip-loads/${rows[0].id}`, { plungeFraction: 2 })).status).toBe(400)
    const theirs = (await other.crib.get('/api/chip-loads')).body[0]
    expect((await shop.crib.patch(`/api/chip-loads/${theirs.id}`, { chipLoadMinMm: 0.1 })).status).toBe(404)
  })
})
