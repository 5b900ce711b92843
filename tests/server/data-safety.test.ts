// Data that must not be lost or corrupted: cuts belong to a time the bit was in a spindle, a
// regrind batch always comes back, money never overflows, a double press makes one draft, the
// shop always keeps an owner who can sign in, and settings keep what the owner meant.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import { Client } from '../support/http'
import { addRegrindFixture, cutterState, type RegrindFixture } from '../support/regrind'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

const DAY = 86_400_000
let shop: TestShop
let fx: RegrindFixture
let mdf: { id: number }
const key = () => `test-${randomUUID()}`

beforeAll(async () => {
  shop = await makeShop('Data safety')
  fx = await addRegrindFixture(shop.id, `regrind-${randomUUID().slice(0, 8)}@example.com`)
  mdf = (await shop.operator.get('/api/materials')).body.find((m: { name: string }) => m.name === 'MDF')
})

describe('a cut belongs to a time the bit was in a spindle', () => {
  it('a cut on a cutter in the crib is refused with a sentence, and nothing is written', async () => {
    const [c] = await fx.add([{ status: 'in_crib' }])
    const res = await shop.operator.post(`/api/cutters/${c!.id}/cuts`, { idempotencyKey: key(), materialId: mdf.id, minutes: 10, outcome: 'clean' })
    expect(res.status).toBe(409)
    expect(res.body.message).toBe(`Cutter ${c!.code} is in the crib: a cut can only be logged on a cutter loaded in a machine. Load it first.`)
    expect((await cutterState(c!.id)).cutter).toMatchObject({ minutes_total: 0, life_used: 0 })
  })

  it('a "broken" cut on a bit inside a sent regrind batch is refused, and the batch comes back whole', async () => {
    const [a, b] = await fx.add([{ lifeUsed: 1 }, { lifeUsed: 1 }])
    const batch = (await shop.crib.post('/api/regrind/batches', { cutterIds: [a!.id, b!.id], supplierId: fx.supplier.id })).body.batch
    expect((await shop.crib.post(`/api/regrind/batches/${batch.id}/send`, {})).status).toBe(200)
    const cut = await shop.operator.post(`/api/cutters/${a!.id}/cuts`, { idempotencyKey: key(), materialId: mdf.id, minutes: 5, outcome: 'broken' })
    expect(cut.status).toBe(409)
    expect(cut.body.message).toMatch(/is out for resharpening: a cut can only be logged on a cutter loaded in a machine/)
    const received = await shop.crib.post(`/api/regrind/batches/${batch.id}/receive`, {
      items: [{ cutterId: a!.id, diameterMm: 6.2 }, { cutterId: b!.id, diameterMm: 6.2 }],
    })
    expect(received.status).toBe(200)
    expect(received.body.batch.totals).toMatchObject({ reground: 2 })
  })

  it('a log that waited on a phone counts when its cut time falls in a stretch the bit was loaded, and not otherwise', async () => {
    const [c] = await fx.add([{ status: 'in_crib' }])
    const beforeLoad = new Date(Date.now() - 60_000).toISOString()
    await new Promise((r) => setTimeout(r, 20))
    expect((await shop.operator.post(`/api/cutters/${c!.id}/load`, { machineId: fx.machineId })).status).toBe(200)
    await new Promise((r) => setTimeout(r, 50))
    const whileLoaded = new Date().toISOString()
    await new Promise((r) => setTimeout(r, 50))
    expect((await shop.operator.post(`/api/cutters/${c!.id}/return`)).status).toBe(200)

    const late = await shop.operator.post(`/api/cutters/${c!.id}/cuts`, { idempotencyKey: key(), materialId: mdf.id, minutes: 12, outcome: 'clean', cutAt: whileLoaded })
    expect(late.status).toBe(201)
    const early = await shop.operator.post(`/api/cutters/${c!.id}/cuts`, { idempotencyKey: key(), materialId: mdf.id, minutes: 12, outcome: 'clean', cutAt: beforeLoad })
    expect(early.status).toBe(409)
    expect(early.body.message).toMatch(/was not loaded in a machine at the time of this cut/)
    expect((await cutterState(c!.id)).cutter).toMatchObject({ status: 'in_crib', minutes_total: 12 })
  })

  it('a batch whose bit changed status while it was out can still be received, that bit written off as it is', async () => {
    const [a, b] = await fx.add([{ lifeUsed: 1 }, { lifeUsed: 1 }])
    const batch = (await shop.crib.post('/api/regrind/batches', { cutterIds: [a!.id, b!.id], supplierId: fx.supplier.id })).body.batch
    await shop.crib.post(`/api/regrind/batches/${batch.id}/send`, {})
    // As the old cut route left it: retired (broken) while at the regrinder.
    const db = appDb()
    try {
      await db.updateTable('cutters').set({ status: 'retired', retired_reason: 'broken' }).where('id', '=', a!.id).execute()
    } finally {
      await db.destroy()
    }
    const received = await shop.crib.post(`/api/regrind/batches/${batch.id}/receive`, {
      items: [{ cutterId: a!.id, scrapReason: 'broke before it went out' }, { cutterId: b!.id, diameterMm: 6.2 }],
    })
    expect(received.status).toBe(200)
    expect(received.body.batch.status).toBe('received')
    expect((await cutterState(a!.id)).cutter).toMatchObject({ status: 'retired', regrind_count: 0 })
    expect((await cutterState(b!.id)).cutter).toMatchObject({ status: 'in_crib', regrind_count: 1 })
  })
})

describe('imports', () => {
  it('refuses cutters "at regrind", which nothing could ever receive, with what to do instead', async () => {
    const type = (await shop.crib.get(`/api/cutter-types/${fx.typeId}`)).body
    const res = await shop.crib.post('/api/import/cutters', { csv: `type,status\n"${type.name.replace(/"/g, '""')}",at_regrind\n` })
    expect(res.status).toBe(400)
    expect(res.body.data.rows).toEqual([{ row: 2, field: 'status', message: expect.stringMatching(/^cannot be at_regrind: import it as in_crib, then put it in a resharpening batch/) }])
  })
})

describe('orders', () => {
  let orders: TestShop
  let spindle: SpindleFixture
  let supplierId: number

  beforeAll(async () => {
    orders = await makeShop('Big orders')
    spindle = await addSpindleFixture(orders.id, 2, 600)
    const db = appDb()
    try {
      supplierId = (await db.insertInto('suppliers').values({ shop_id: orders.id, name: 'Far Hill Tooling', email: `far-${orders.id}@example.com`, lead_time_days: 7 })
        .returning('id').executeTakeFirstOrThrow()).id
      await db.updateTable('cutter_types').set({ supplier_id: supplierId, unit_cost_cents: 4000 }).where('id', '=', spindle.typeId).execute()
      const material = await db.selectFrom('materials').select('id').where('shop_id', '=', orders.id).where('name', '=', 'MDF').executeTakeFirstOrThrow()
      // A cutter's life used every day for 90 days: demand enough for a suggestion.
      const now = Date.now()
      await db.insertInto('cut_logs').values(Array.from({ length: 90 }, (_, k) => ({
        shop_id: orders.id, cutter_id: spindle.cutters[0]!.id, material_id: material.id, minutes: 600, wear_factor: 1, life_added: 1,
        outcome: 'clean' as const, idempotency_key: `steady-${orders.id}-${k}`, cut_at: new Date(now - k * DAY - 1000),
      }))).execute()
    } finally {
      await db.destroy()
    }
  })

  it('one line of 10,000 x $2,500.00 leaves the order list working, with the total in full', async () => {
    const order = await orders.crib.post('/api/orders', { supplierId, lines: [{ typeId: spindle.typeId, quantity: 10_000, unitCostCents: 250_000 }] })
    expect(order.status).toBe(201)
    const list = await orders.crib.get('/api/orders')
    expect(list.status).toBe(200)
    expect(list.body.find((o: { id: number }) => o.id === order.body.id).totalCents).toBe(2_500_000_000)
    await orders.crib.post(`/api/orders/${order.body.id}/cancel`)
  })

  it('refuses a unit price above $100,000.00 with the field named', async () => {
    const res = await orders.crib.post('/api/orders', { supplierId, lines: [{ typeId: spindle.typeId, quantity: 1, unitCostCents: 10_000_001 }] })
    expect(res.status).toBe(400)
    expect(res.body.data.fields['lines.0.unitCostCents']).toMatch(/at most 100000.00/)
  })

  it('pressing "turn suggestions into orders" twice at once makes one draft for the supplier', async () => {
    const db = appDb()
    try {
      await db.deleteFrom('purchase_orders').where('shop_id', '=', orders.id).where('status', '=', 'draft').execute()
      const [one, two] = await Promise.all([0, 1].map(() => orders.crib.post('/api/orders/from-suggestions', { typeIds: [spindle.typeId] })))
      expect(one!.status).toBe(201)
      expect(two!.body.orderIds).toEqual(one!.body.orderIds)
      const drafts = await db.selectFrom('purchase_orders').select('id').where('shop_id', '=', orders.id).where('supplier_id', '=', supplierId)
        .where('status', '=', 'draft').execute()
      expect(drafts).toHaveLength(1)
    } finally {
      await db.destroy()
    }
  })
})

describe('the shop keeps an owner who can sign in', () => {
  it('an owner invited but never signed in does not count: the only real owner cannot demote themself', async () => {
    const s = await makeShop('One owner')
    expect((await s.owner.post('/api/invitations', { email: `later-${randomUUID().slice(0, 8)}@example.com`, name: 'Not Yet', role: 'owner' })).status).toBe(201)
    const res = await s.owner.patch(`/api/users/${s.ids.owner}`, { role: 'crib_manager' })
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/at least one owner/)
    expect((await s.owner.get('/api/me')).body.role).toBe('owner')
  })
})

describe('settings keep what the owner meant', () => {
  it('a threshold below a sane floor is refused with a sentence; a fine one keeps its precision', async () => {
    const low = await shop.owner.patch('/api/shop', { lifeThreshold: 0.009 })
    expect(low.status).toBe(400)
    expect(low.body.data.fields.lifeThreshold).toMatch(/at least 50 %: below that, cutters would go for resharpening/)
    expect((await shop.owner.patch('/api/shop', { regrindLifeFraction: 0.05 })).status).toBe(400)
    expect((await shop.owner.patch('/api/shop', { lifeThreshold: 0.875 })).status).toBe(200)
    expect((await shop.owner.patch('/api/shop', { reportTime: '06:15' })).status).toBe(200)
    expect((await shop.owner.get('/api/shop')).body).toMatchObject({ lifeThreshold: 0.875, reportTime: '06:15' })
  })

  it('is the owner\'s: others are refused', async () => {
    expect((await shop.crib.patch('/api/shop', { lifeThreshold: 0.8 })).status).toBe(403)
    expect((await new Client().patch('/api/shop', { lifeThreshold: 0.8 })).status).toBe(401)
  })
})
