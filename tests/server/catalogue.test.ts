// The catalogue and suppliers: create, list, change, archive; the rules between fields named by
// field; names unique per shop; crib managers only for writes; other shops' ids are 404.
import { beforeAll, describe, expect, it } from 'vitest'
import { newLabelCode } from '../../shared/kerf/label-code'
import { appDb } from '../support/db'
import { makeShop, type TestShop } from '../support/shops'

let shop: TestShop
let other: TestShop

const typeBody = (change: Record<string, unknown> = {}) => ({
  name: `Upcut 1/4 ${Math.random().toString(36).slice(2, 8)}`, profile: 'square_end', helix: 'upcut', flutes: 2,
  cuttingDiameterMm: 6.35, shankDiameterMm: 6.35, cuttingLengthMm: 22, overallLengthMm: 64, ratedLifeMinutes: 900,
  minUsableDiameterMm: 6, unitCostCents: 3900, ...change,
})

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Catalogue'), makeShop('Elsewhere')])
})

describe('cutter types', () => {
  it('are created (201) with the defaults of the database and listed with every field in camelCase', async () => {
    const supplier = (await shop.crib.post('/api/suppliers', { name: 'Fenwick Bits', leadTimeDays: 9 })).body
    const res = await shop.crib.post('/api/cutter-types', typeBody({ name: 'Compression 1/4', helix: 'compression', supplierId: supplier.id, supplierPartNumber: 'FB-2C' }))
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({
      name: 'Compression 1/4', helix: 'compression', profile: 'square_end', flutes: 2, cuttingDiameterMm: 6.35, shankDiameterMm: 6.35,
      cuttingLengthMm: 22, overallLengthMm: 64, ratedLifeMinutes: 900, minUsableDiameterMm: 6, unitCostCents: 3900,
      toolMaterial: 'solid_carbide', maxRegrinds: 2, regrindDiameterLossMm: 0.2, regrindCostCents: 0, packSize: 1, serviceLevel: 0.95,
      leadTimeDaysOverride: null, leadTimeDays: 9, vAngleDeg: null, supplierId: supplier.id, supplierName: 'Fenwick Bits', supplierPartNumber: 'FB-2C',
      active: true, stock: { in_crib: 0, in_spindle: 0, at_regrind: 0, retired: 0, lost: 0 },
    })
    const list = await shop.crib.get('/api/cutter-types')
    expect(list.status).toBe(200)
    expect(list.body.find((t: { id: number }) => t.id === res.body.id)).toEqual(res.body)
  })

  it('count their cutters by status', async () => {
    const type = (await shop.crib.post('/api/cutter-types', typeBody())).body
    const db = appDb()
    try {
      await db.insertInto('cutters').values([
        { shop_id: shop.id, type_id: type.id, code: newLabelCode(), diameter_mm: 6.35 },
        { shop_id: shop.id, type_id: type.id, code: newLabelCode(), diameter_mm: 6.35 },
        { shop_id: shop.id, type_id: type.id, code: newLabelCode(), diameter_mm: 6.2, status: 'at_regrind' },
      ]).execute()
    } finally {
      await db.destroy()
    }
    const one = await shop.crib.get(`/api/cutter-types/${type.id}`)
    expect(one.body.stock).toEqual({ in_crib: 2, in_spindle: 0, at_regrind: 1, retired: 0, lost: 0 })
  })

  it('are changed field by field, and archived and restored without being deleted', async () => {
    const type = (await shop.crib.post('/api/cutter-types', typeBody())).body
    const changed = await shop.crib.patch(`/api/cutter-types/${type.id}`, { unitCostCents: 4250, serviceLevel: 0.99, leadTimeDaysOverride: 21 })
    expect(changed.status).toBe(200)
    expect(changed.body).toMatchObject({ unitCostCents: 4250, serviceLevel: 0.99, leadTimeDaysOverride: 21, leadTimeDays: 21, ratedLifeMinutes: 900 })

    const archived = await shop.crib.patch(`/api/cutter-types/${type.id}`, { active: false })
    expect(archived.body.active).toBe(false)
    expect((await shop.crib.get('/api/cutter-types')).body.map((t: { id: number }) => t.id)).not.toContain(type.id)
    expect((await shop.crib.get('/api/cutter-types?archived=include')).body.map((t: { id: number }) => t.id)).toContain(type.id)
    expect((await shop.crib.patch(`/api/cutter-types/${type.id}`, { active: true })).body.active).toBe(true)
    const nothing = await shop.crib.patch(`/api/cutter-types/${type.id}`, {})
    expect(nothing.status).toBe(200)
    expect(nothing.body.unitCostCents).toBe(4250)
  })

  it('a V-bit keeps its angle, and choosing another profile takes the angle away', async () => {
    const vee = await shop.crib.post('/api/cutter-types', typeBody({ profile: 'v_bit', vAngleDeg: 60, helix: 'straight', cuttingDiameterMm: 12.7, minUsableDiameterMm: 12.5 }))
    expect(vee.status).toBe(201)
    expect(vee.body.vAngleDeg).toBe(60)
    const square = await shop.crib.patch(`/api/cutter-types/${vee.body.id}`, { profile: 'square_end' })
    expect(square.body).toMatchObject({ profile: 'square_end', vAngleDeg: null })
  })
})

describe('the rules between fields answer 400 naming the field', () => {
  const cases: Array<[string, Record<string, unknown>, string]> = [
    ['overall length shorter than the cutting length', { cuttingLengthMm: 30, overallLengthMm: 25 }, 'overallLengthMm'],
    ['smallest usable diameter above the cutting diameter', { minUsableDiameterMm: 6.5 }, 'minUsableDiameterMm'],
    ['a V-bit without its angle', { profile: 'v_bit' }, 'vAngleDeg'],
    ['an angle on a square-end bit', { vAngleDeg: 90 }, 'vAngleDeg'],
    ['no flutes', { flutes: 0 }, 'flutes'],
    ['a price in dollars instead of cents', { unitCostCents: 39.5 }, 'unitCostCents'],
    ['a service level of 100 %', { serviceLevel: 1 }, 'serviceLevel'],
  ]
  it.each(cases)('on create: %s', async (_label, change, field) => {
    const res = await shop.crib.post('/api/cutter-types', typeBody(change))
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields)).toContain(field)
    expect(res.body.message).toContain(field)
  })

  it('on update, against the row as it will be', async () => {
    const type = (await shop.crib.post('/api/cutter-types', typeBody())).body
    const short = await shop.crib.patch(`/api/cutter-types/${type.id}`, { overallLengthMm: 20 })
    expect(short.status).toBe(400)
    expect(short.body.data.fields.overallLengthMm).toBe('must be at least the cutting length')
    const vee = await shop.crib.patch(`/api/cutter-types/${type.id}`, { profile: 'v_bit' })
    expect(vee.status).toBe(400)
    expect(vee.body.data.fields).toEqual({ vAngleDeg: 'a V-bit needs its included angle' })
    expect((await shop.crib.get(`/api/cutter-types/${type.id}`)).body).toMatchObject({ overallLengthMm: 64, profile: 'square_end' })
  })
})

describe('names are unique in a shop', () => {
  it('a second type of the same name, in any case, is a 409 naming the field', async () => {
    await shop.crib.post('/api/cutter-types', typeBody({ name: 'Downcut 3/8' }))
    const again = await shop.crib.post('/api/cutter-types', typeBody({ name: 'downcut 3/8' }))
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/^name: another cutter type already has this name/)
    expect(again.body.data.fields.name).toBeTruthy()
    const renamed = (await shop.crib.post('/api/cutter-types', typeBody())).body
    expect((await shop.crib.patch(`/api/cutter-types/${renamed.id}`, { name: 'Downcut 3/8' })).status).toBe(409)
    // Another shop may use the same name.
    expect((await other.crib.post('/api/cutter-types', typeBody({ name: 'Downcut 3/8' }))).status).toBe(201)
  })

  it('and so is a second supplier of the same name', async () => {
    expect((await shop.crib.post('/api/suppliers', { name: 'Tarn Tooling' })).status).toBe(201)
    const again = await shop.crib.post('/api/suppliers', { name: 'TARN TOOLING' })
    expect(again.status).toBe(409)
    expect(again.body.data.fields.name).toMatch(/another supplier/)
  })

  it('holds when two people save names differing only in case at the same moment', async () => {
    const [upper, lower] = await Promise.all([
      shop.crib.post('/api/cutter-types', typeBody({ name: 'V-GROOVE 90' })),
      shop.owner.post('/api/cutter-types', typeBody({ name: 'v-groove 90' })),
    ])
    expect([upper.status, lower.status].sort()).toEqual([201, 409])
    expect((upper.status === 409 ? upper : lower).body.data.fields.name).toMatch(/another cutter type/)
    const [a, b] = await Promise.all([
      shop.crib.post('/api/suppliers', { name: 'Moorside Grinding' }),
      shop.owner.post('/api/suppliers', { name: 'MOORSIDE GRINDING' }),
    ])
    expect([a.status, b.status].sort()).toEqual([201, 409])
  })
})

describe('suppliers', () => {
  it('are created, listed with their types, changed and archived', async () => {
    const res = await shop.crib.post('/api/suppliers', { name: 'Quarry Lane Cutters', email: 'Orders@Example.com', phone: '555-0100', leadTimeDays: 4, note: 'Ships Mondays' })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: 'Quarry Lane Cutters', email: 'orders@example.com', phone: '555-0100', leadTimeDays: 4, note: 'Ships Mondays', active: true, typeCount: 0 })
    await shop.crib.post('/api/cutter-types', typeBody({ supplierId: res.body.id }))

    const changed = await shop.crib.patch(`/api/suppliers/${res.body.id}`, { leadTimeDays: 6, phone: '' })
    expect(changed.body).toMatchObject({ leadTimeDays: 6, phone: null, email: 'orders@example.com', typeCount: 1 })

    expect((await shop.crib.patch(`/api/suppliers/${res.body.id}`, { active: false })).body.active).toBe(false)
    expect((await shop.crib.get('/api/suppliers')).body.map((s: { id: number }) => s.id)).not.toContain(res.body.id)
    expect((await shop.crib.get('/api/suppliers?archived=include')).body.map((s: { id: number }) => s.id)).toContain(res.body.id)
    expect((await shop.crib.get(`/api/suppliers/${res.body.id}`)).body.active).toBe(false)
  })

  it('a bad e-mail or lead time is a 400 naming the field', async () => {
    const res = await shop.crib.post('/api/suppliers', { name: 'Odd One', email: 'not-an-address', leadTimeDays: 400 })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(['email', 'leadTimeDays'])
  })
})

describe('who may', () => {
  it('operators read the catalogue list, and nothing else of it', async () => {
    const type = (await shop.crib.post('/api/cutter-types', typeBody())).body
    const supplier = (await shop.crib.post('/api/suppliers', { name: `Closed ${Date.now()}` })).body
    expect((await shop.operator.get('/api/cutter-types')).status).toBe(200)
    const refused = [
      await shop.operator.get(`/api/cutter-types/${type.id}`),
      await shop.operator.post('/api/cutter-types', typeBody()),
      await shop.operator.patch(`/api/cutter-types/${type.id}`, { active: false }),
      await shop.operator.get('/api/suppliers'),
      await shop.operator.get(`/api/suppliers/${supplier.id}`),
      await shop.operator.post('/api/suppliers', { name: 'Sneaky' }),
      await shop.operator.patch(`/api/suppliers/${supplier.id}`, { active: false }),
    ]
    for (const res of refused) {
      expect(res.body.message).toMatch(/needs the crib manager role/)
    }
    expect((await shop.crib.get(`/api/cutter-types/${type.id}`)).body.active).toBe(true)
    expect((await shop.owner.post('/api/cutter-types', typeBody())).status).toBe(201)
  })

  it('another shop\'s types and suppliers are 404, and never listed', async () => {
    const type = (await shop.crib.post('/api/cutter-types', typeBody())).body
    const supplier = (await shop.crib.post('/api/suppliers', { name: `Ours ${Date.now()}` })).body
    expect((await other.crib.get(`/api/cutter-types/${type.id}`)).status).toBe(404)
    const patched = await other.crib.patch(`/api/cutter-types/${type.id}`, { active: false })
    expect(patched.status).toBe(404)
    expect(patched.body.message).toBe('No such cutter type in your shop.')
    expect((await other.crib.get(`/api/suppliers/${supplier.id}`)).status).toBe(404)
    expect((await other.crib.patch(`/api/suppliers/${supplier.id}`, { name: 'Taken over' })).status).toBe(404)
    const theirs = await other.crib.post('/api/cutter-types', typeBody({ supplierId: supplier.id }))
    expect(theirs.status).toBe(400)
    expect(theirs.body.data.fields.supplierId).toBe('no such supplier in your shop')
    expect((await other.crib.get('/api/cutter-types?archived=include')).body.map((t: { id: number }) => t.id)).not.toContain(type.id)
    expect((await other.crib.get('/api/suppliers?archived=include')).body.map((s: { id: number }) => s.id)).not.toContain(supplier.id)
    expect((await shop.crib.get(`/api/cutter-types/${type.id}`)).body.active).toBe(true)
  })
})
