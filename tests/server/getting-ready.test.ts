// Home's getting-ready steps: a new shop has them open, and each ticks from the shop's own rows as
// the shop does it through the ordinary routes. The demo shop, which has done everything, is checked in seed.test.ts.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { GETTING_READY_STEPS } from '../../shared/kerf/getting-ready'
import type { Client } from '../support/http'
import { makeShop, type TestShop } from '../support/shops'
import { loadCutters } from '../support/spindle'

let shop: TestShop

interface Ready { done: boolean, steps: Array<{ key: string, to: string | null, done: boolean }> }

async function openSteps(client: Client = shop.crib): Promise<string[]> {
  const res = await client.get('/api/getting-ready')
  expect(res.status).toBe(200)
  return (res.body as Ready).steps.filter((s) => !s.done).map((s) => s.key)
}

beforeAll(async () => {
  shop = await makeShop('Ready')
  // makeShop writes an operator straight in; switch them off so the shop starts with none, as a real one does.
  const off = await shop.owner.patch(`/api/users/${shop.ids.operator}`, { active: false })
  expect(off.status).toBe(200)
})

describe('getting ready', () => {
  it('lists every step open for a fresh shop, in order, each with the page that does it', async () => {
    const res = await shop.owner.get('/api/getting-ready')
    expect(res.status).toBe(200)
    expect(res.body.done).toBe(false)
    expect(res.body.steps).toEqual(GETTING_READY_STEPS.map((s) => ({ ...s, done: false })))
    // Only owners invite people by e-mail: the crib manager's operator step leads to adding one by name and PIN.
    const crib = (await shop.crib.get('/api/getting-ready')).body as Ready
    expect(crib.steps.find((s) => s.key === 'operator')).toMatchObject({ to: '/crib/devices', done: false })
    expect(crib.steps.find((s) => s.key === 'machine')).toMatchObject({ to: '/crib/machines' })
  })

  it('ticks each step as the shop adds a machine, supplier, cutter type, cutters, operator and a cut', async () => {
    const all = GETTING_READY_STEPS.map((s) => s.key)
    expect(await openSteps()).toEqual(all)

    const machine = await shop.crib.post('/api/machines', { name: 'Main table', minRpm: 6000, maxRpm: 24000, pockets: 0 })
    expect(machine.status).toBe(201)
    expect(await openSteps()).toEqual(all.filter((k) => k !== 'machine'))

    const supplier = await shop.crib.post('/api/suppliers', { name: 'Bit seller' })
    expect(supplier.status).toBe(201)
    expect(await openSteps()).toEqual(['materials', 'cutterType', 'stock', 'operator', 'firstCut'])

    const type = await shop.crib.post('/api/cutter-types', {
      name: 'Upcut 1/4', profile: 'square_end', helix: 'upcut', flutes: 2, cuttingDiameterMm: 6.35, shankDiameterMm: 6.35,
      cuttingLengthMm: 22, overallLengthMm: 64, ratedLifeMinutes: 900, minUsableDiameterMm: 6, unitCostCents: 3900, supplierId: supplier.body.id,
    })
    expect(type.status).toBe(201)
    expect(await openSteps()).toEqual(['materials', 'stock', 'operator', 'firstCut'])

    const delivery = await shop.crib.post('/api/deliveries', { typeId: type.body.id, quantity: 3 })
    expect(delivery.status).toBe(201)
    expect(await openSteps()).toEqual(['materials', 'operator', 'firstCut'])

    const invite = await shop.owner.post('/api/invitations', { email: `new-operator-${randomUUID().slice(0, 8)}@example.com`, name: 'New Operator', role: 'operator' })
    expect(invite.status).toBe(201)
    expect(await openSteps()).toEqual(['materials', 'firstCut'])

    // The starting materials alone do not tick "checked"; a cut logged on one does.
    const materials = (await shop.crib.get('/api/materials')).body as Array<{ id: number, name: string }>
    const cutterId = delivery.body.cutters[0].id as number
    await loadCutters(shop.crib, [cutterId], machine.body.id)
    const cut = await shop.crib.post(`/api/cutters/${cutterId}/cuts`, { idempotencyKey: `ready-${randomUUID()}`, materialId: materials[0]!.id, minutes: 12, outcome: 'clean' })
    expect(cut.status).toBe(201)
    expect(await openSteps()).toEqual([])
    expect((await shop.owner.get('/api/getting-ready')).body.done).toBe(true)
  })

  it('counts the materials checked once the shop adds one of its own, before any cut', async () => {
    const fresh = await makeShop('Ready materials')
    expect(await openSteps(fresh.crib)).toContain('materials')
    const added = await fresh.crib.post('/api/materials', { name: 'Cork board', family: 'wood', wearFactor: 0.6 })
    expect(added.status).toBe(201)
    expect(await openSteps(fresh.crib)).not.toContain('materials')
    // A retired machine does not count as the shop having one.
    const machine = await fresh.crib.post('/api/machines', { name: 'Old router', minRpm: 6000, maxRpm: 24000, pockets: 0 })
    expect(await openSteps(fresh.crib)).not.toContain('machine')
    expect((await fresh.crib.post(`/api/machines/${machine.body.id}/retire`, {})).status).toBe(200)
    expect(await openSteps(fresh.crib)).toContain('machine')
  })
})
