// Reordering from measured demand, and purchase orders from suggestion to received stock.
import jstat from 'jstat'
import { beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import { Client, waitForMail } from '../support/http'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

const { jStat } = jstat
const DAY = 86_400_000
let shop: TestShop
let other: TestShop
let fx: SpindleFixture
let supplierEmail: string

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Orders'), makeShop('Nosy')])
  fx = await addSpindleFixture(shop.id, 3, 600)
  supplierEmail = `sales-${shop.id}@example.com`
  const db = appDb()
  try {
    const supplier = await db.insertInto('suppliers').values({ shop_id: shop.id, name: 'Quarry Lane Tooling', email: supplierEmail, lead_time_days: 7 })
      .returning('id').executeTakeFirstOrThrow()
    await db.updateTable('cutter_types')
      .set({ supplier_id: supplier.id, max_regrinds: 2, unit_cost_cents: 4000, pack_size: 2, supplier_part_number: 'QL-250-2F' })
      .where('id', '=', fx.typeId).execute()
    const mdf = await db.selectFrom('materials').select(['id', 'wear_factor']).where('shop_id', '=', shop.id).where('name', '=', 'MDF').executeTakeFirstOrThrow()
    expect(mdf.wear_factor).toBe(1)
    // Steady use for 90 days: 1560 minutes of MDF a day on a 600-minute type is 2.6 lives a day,
    // which with 2 regrinds at a 0.8 fraction (1 + 2 × 0.8 = 2.6 lives per cutter) is one cutter a day.
    const now = Date.now()
    const logs = []
    for (let k = 0; k < 90; k++) {
      for (const half of [0, 1]) {
        logs.push({
          shop_id: shop.id, cutter_id: fx.cutters[0]!.id, material_id: mdf.id, minutes: 780, wear_factor: 1, life_added: 1.3,
          outcome: 'clean' as const, idempotency_key: `steady-${shop.id}-${k}-${half}`, cut_at: new Date(now - k * DAY - 1000 - half),
        })
      }
    }
    await db.insertInto('cut_logs').values(logs).execute()
  } finally {
    await db.destroy()
  }
})

describe('reorder figures', () => {
  it('follow the textbook formulas from the shop\'s own cut logs', async () => {
    const res = await shop.crib.get('/api/reorder')
    expect(res.status).toBe(200)
    const row = res.body.find((r: { typeId: number }) => r.typeId === fx.typeId)
    expect(row.dailyDemand).toBeCloseTo(1, 9)
    expect(row.sdDailyDemand).toBeCloseTo(0, 9)
    // One cutter a day over 7 days is 7 cutters over the lead time: a slow mover, so Poisson decides.
    // The smallest s with P(D ≤ s) ≥ 95 %, found again from jStat's Poisson distribution.
    expect(row.method).toBe('poisson')
    expect(row.leadTimeDemand).toBeCloseTo(7, 9)
    let s = 0
    while (jStat.poisson.cdf(s, 7) < 0.95) s++
    expect(row.reorderPoint).toBe(s)
    // EOQ = √(2 · 365 · $25 / ($40 · 0.25)) = √1825 ≈ 42.7, rounded up to packs of two: 44.
    expect(row.economicOrderQuantity).toBeCloseTo(Math.sqrt(1825), 6)
    expect(row).toMatchObject({ available: 3, onOrder: 0, belowReorderPoint: true, suggestedQty: 44, leadTimeDays: 7, supplierName: 'Quarry Lane Tooling' })
  })

  it('is for the crib: operators are refused', async () => {
    expect((await shop.operator.get('/api/reorder')).status).toBe(403)
    expect((await new Client().get('/api/reorder')).status).toBe(401)
  })
})

describe('purchase orders', () => {
  let orderId: number

  it('suggestions become one draft per supplier, and a second click adds to the same draft', async () => {
    const first = await shop.crib.post('/api/orders/from-suggestions', { typeIds: [fx.typeId] })
    expect(first.status).toBe(201)
    expect(first.body.orderIds).toHaveLength(1)
    orderId = first.body.orderIds[0]
    const again = await shop.crib.post('/api/orders/from-suggestions', { typeIds: [fx.typeId] })
    expect(again.body.orderIds).toEqual([orderId])
    const order = (await shop.crib.get(`/api/orders/${orderId}`)).body
    expect(order).toMatchObject({ status: 'draft', supplier: { name: 'Quarry Lane Tooling' } })
    expect(order.lines).toEqual([expect.objectContaining({ typeId: fx.typeId, quantity: 44, unitCostCents: 4000, totalCents: 176000 })])
    expect((await shop.crib.get('/api/reorder')).body.find((r: { typeId: number }) => r.typeId === fx.typeId).inDraft).toBe(44)
  })

  it('a draft can be edited; the supplier gets the lines by e-mail when it is sent', async () => {
    const edited = await shop.crib.patch(`/api/orders/${orderId}`, { lines: [{ typeId: fx.typeId, quantity: 10 }], note: 'Deliver to the back door' })
    expect(edited.status).toBe(200)
    expect(edited.body.totalCents).toBe(40000)
    const sent = await shop.crib.post(`/api/orders/${orderId}/send`)
    expect(sent.status).toBe(200)
    expect(sent.body.status).toBe('sent')
    const mail = await waitForMail(supplierEmail, sent.body.number)
    expect(mail.text).toContain('10 x QL-250-2F')
    expect(mail.text).toContain('Order total: $400.00')
    expect(mail.text).toContain('Deliver to the back door')
    expect((await shop.crib.post(`/api/orders/${orderId}/send`)).status).toBe(409)
    expect((await shop.crib.patch(`/api/orders/${orderId}`, { note: 'too late' })).status).toBe(409)
  })

  it('a sent order counts as stock on order', async () => {
    const row = (await shop.crib.get('/api/reorder')).body.find((r: { typeId: number }) => r.typeId === fx.typeId)
    expect(row).toMatchObject({ onOrder: 10, inDraft: 0, position: 13 })
    expect(row.belowReorderPoint).toBe(false)
  })

  it('receiving creates the cutters with label codes in one step, part by part', async () => {
    const order = (await shop.crib.get(`/api/orders/${orderId}`)).body
    const lineId = order.lines[0].id
    const part = await shop.crib.post(`/api/orders/${orderId}/receive`, { lines: [{ lineId, quantity: 4, diameterMm: 6.33 }] })
    expect(part.status).toBe(200)
    expect(part.body.order.status).toBe('partly_received')
    expect(part.body.cutters).toHaveLength(4)
    expect(new Set(part.body.cutters.map((c: { code: string }) => c.code)).size).toBe(4)
    expect(part.body.labelsUrl).toBe(`/labels?ids=${part.body.cutters.map((c: { id: number }) => c.id).join(',')}`)

    const tooMany = await shop.crib.post(`/api/orders/${orderId}/receive`, { lines: [{ lineId, quantity: 7 }] })
    expect(tooMany.status).toBe(400)
    expect(tooMany.body.message).toMatch(/only 6 .* still to come/)

    const rest = await shop.crib.post(`/api/orders/${orderId}/receive`, { lines: [{ lineId, quantity: 6 }] })
    expect(rest.body.order.status).toBe('received')

    const db = appDb()
    try {
      const made = await db.selectFrom('cutters').select(['id', 'status', 'diameter_mm', 'order_line_id'])
        .where('id', 'in', part.body.cutters.map((c: { id: number }) => c.id)).execute()
      expect(made.every((c) => c.status === 'in_crib' && c.diameter_mm === 6.33 && c.order_line_id === lineId)).toBe(true)
      const events = await db.selectFrom('cutter_events').select('kind').where('cutter_id', '=', made[0]!.id).execute()
      expect(events.map((e) => e.kind)).toEqual(['received'])
    } finally {
      await db.destroy()
    }
    expect((await shop.crib.post(`/api/orders/${orderId}/receive`, { lines: [{ lineId, quantity: 1 }] })).status).toBe(409)
  })

  it('an ad-hoc delivery needs no order', async () => {
    const res = await shop.crib.post('/api/deliveries', { typeId: fx.typeId, quantity: 3 })
    expect(res.status).toBe(201)
    expect(res.body.cutters).toHaveLength(3)
    const bad = await shop.crib.post('/api/deliveries', { typeId: fx.typeId, quantity: 0 })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.quantity).toBe('must be at least 1')
  })

  it('a supplier without an e-mail address gets a clear refusal, and nothing changes', async () => {
    const db = appDb()
    const supplier = await db.insertInto('suppliers').values({ shop_id: shop.id, name: 'Counter Sales Only' }).returning('id').executeTakeFirstOrThrow()
    await db.destroy()
    const draft = await shop.crib.post('/api/orders', { supplierId: supplier.id, lines: [{ typeId: fx.typeId, quantity: 2 }] })
    expect(draft.status).toBe(201)
    const send = await shop.crib.post(`/api/orders/${draft.body.id}/send`)
    expect(send.status).toBe(400)
    expect(send.body.message).toMatch(/no e-mail address/)
    expect((await shop.crib.get(`/api/orders/${draft.body.id}`)).body.status).toBe('draft')
    expect((await shop.crib.post(`/api/orders/${draft.body.id}/cancel`)).body.status).toBe('cancelled')
  })

  it('operators are refused and another shop sees nothing', async () => {
    expect((await shop.operator.get('/api/orders')).status).toBe(403)
    expect((await shop.operator.post('/api/deliveries', { typeId: fx.typeId, quantity: 1 })).status).toBe(403)
    expect((await other.crib.get(`/api/orders/${orderId}`)).status).toBe(404)
    expect((await other.crib.post(`/api/orders/${orderId}/cancel`)).status).toBe(404)
    expect((await other.crib.post('/api/deliveries', { typeId: fx.typeId, quantity: 1 })).status).toBe(400)
    expect((await other.crib.get('/api/orders')).body).toEqual([])
  })
})
