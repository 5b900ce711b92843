// The shop's materials: adding, changing, retiring and bringing back, names unique in any case,
// and a changed wear factor that never rewrites cuts already logged.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let other: TestShop
let fx: SpindleFixture

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Materials'), makeShop('Materials elsewhere')])
  fx = await addSpindleFixture(shop.id, 2, 600)
})

describe('materials', () => {
  let id: number

  it('a crib manager adds one; operators see it in the cut-log list', async () => {
    const res = await shop.crib.post('/api/materials', { name: 'Corian', family: 'composite', wearFactor: 2.4 })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: 'Corian', family: 'composite', wearFactor: 2.4, common: true, active: true })
    id = res.body.id
    expect((await shop.operator.get('/api/materials')).body.map((m: { id: number }) => m.id)).toContain(id)
  })

  it('a name in use in any case answers 409 naming the field; another shop may use it', async () => {
    const res = await shop.owner.post('/api/materials', { name: 'CORIAN', family: 'composite', wearFactor: 2 })
    expect(res.status).toBe(409)
    expect(res.body.data.fields.name).toMatch(/already has this name/)
    expect((await shop.crib.patch(`/api/materials/${id}`, { name: 'mdf' })).status).toBe(409)
    expect((await other.crib.post('/api/materials', { name: 'Corian', family: 'composite', wearFactor: 2 })).status).toBe(201)
  })

  it.each([
    ['a wear factor under 0.05', { wearFactor: 0.04 }, 'wearFactor'],
    ['a wear factor over 20', { wearFactor: 20.5 }, 'wearFactor'],
    ['a family not on the list', { family: 'stone' }, 'family'],
    ['no name', { name: '' }, 'name'],
  ])('%s answers 400 naming the field', async (_label, change, field) => {
    const res = await shop.crib.post('/api/materials', { name: `Odd ${randomUUID().slice(0, 6)}`, family: 'wood', wearFactor: 1, ...change })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields)).toContain(field)
  })

  it('a new wear factor counts from the next cut; the cut already logged keeps its own', async () => {
    const c = fx.cutters[0]!
    await shop.operator.post(`/api/cutters/${c.id}/load`, { machineId: fx.machines.changer })
    const first = await shop.operator.post(`/api/cutters/${c.id}/cuts`, { idempotencyKey: randomUUID(), materialId: id, minutes: 60, outcome: 'clean' })
    expect(first.status).toBe(201)
    // Linear damage (Miner's rule): 60 min x 2.4 / 600 min rated = 0.24 of a life.
    expect(first.body.lifeUsed).toBeCloseTo(0.24, 9)
    expect((await shop.crib.patch(`/api/materials/${id}`, { wearFactor: 1.2 })).body.wearFactor).toBe(1.2)
    const second = await shop.operator.post(`/api/cutters/${c.id}/cuts`, { idempotencyKey: randomUUID(), materialId: id, minutes: 60, outcome: 'clean' })
    expect(second.body.lifeUsed).toBeCloseTo(0.24 + 0.12, 9)
  })

  it('retiring takes it out of the pick list, bringing back returns it', async () => {
    const retired = await shop.crib.post(`/api/materials/${id}/retire`)
    expect(retired.body).toMatchObject({ active: false })
    expect((await shop.operator.get('/api/materials')).body.map((m: { id: number }) => m.id)).not.toContain(id)
    expect((await shop.crib.get('/api/materials?retired=include')).body.map((m: { id: number }) => m.id)).toContain(id)
    expect((await shop.crib.post(`/api/materials/${id}/restore`)).body).toMatchObject({ active: true, retiredAt: null })
  })

  it('another shop\'s material answers 404; operators cannot change materials', async () => {
    expect((await other.crib.patch(`/api/materials/${id}`, { wearFactor: 5 })).status).toBe(404)
    expect((await shop.operator.patch(`/api/materials/${id}`, { wearFactor: 5 })).status).toBe(403)
  })
})
