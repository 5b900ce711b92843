// Purchasing a crib manager can trust: slow movers reordered from Poisson demand, the shop's own
// min/max and spares, cutters at the regrinder counted as stock coming back, orders from
// scratch with a PDF, regrind batches received in parts, and the owner's view of stock.
import { randomUUID } from 'node:crypto'
import jstat from 'jstat'
import { beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import { waitForMail } from '../support/http'
import { pdfText } from '../support/pdf'
import { addRegrindFixture, cutterState, type RegrindFixture } from '../support/regrind'
import { makeShop, type TestShop } from '../support/shops'

const { jStat } = jstat
const DAY = 86_400_000
let shop: TestShop
let fx: RegrindFixture
let mdfId: number
let shopName: string

/** The smallest whole s with P(D ≤ s) ≥ α, found from jStat's Poisson distribution (an outside check). */
function jstatReorderPoint(mean: number, level: number): number {
  let s = 0
  while (jStat.poisson.cdf(s, mean) < level) s++
  return s
}

const reorderRow = async (typeId: number) => (await shop.crib.get('/api/reorder')).body.find((r: { typeId: number }) => r.typeId === typeId)

beforeAll(async () => {
  shop = await makeShop('Purchasing')
  fx = await addRegrindFixture(shop.id, `regrind-${randomUUID().slice(0, 8)}@example.com`)
  const db = appDb()
  try {
    shopName = (await db.selectFrom('shops').select('name').where('id', '=', shop.id).executeTakeFirstOrThrow()).name
    await db.updateTable('suppliers').set({ lead_time_days: 12 }).where('id', '=', fx.supplier.id).execute()
    mdfId = (await db.selectFrom('materials').select('id').where('shop_id', '=', shop.id).where('name', '=', 'MDF').executeTakeFirstOrThrow()).id
  } finally {
    await db.destroy()
  }
  // A slow mover, as router bits are: one sharp life used every 9 days on the fixture's type
  // (2 regrinds at the default 0.8 fraction: 2.6 lives per cutter).
  const [cutter] = await fx.add([{ lifeUsed: 0.1, status: 'in_spindle' }])
  const db2 = appDb()
  try {
    const now = Date.now()
    await db2.insertInto('cut_logs').values(Array.from({ length: 10 }, (_, k) => ({
      shop_id: shop.id, cutter_id: cutter!.id, material_id: mdfId, machine_id: fx.machineId, minutes: 600, wear_factor: 1, life_added: 1,
      outcome: 'clean' as const, idempotency_key: `slow-${shop.id}-${k}`, cut_at: new Date(now - (k * 9 + 1) * DAY),
    }))).execute()
  } finally {
    await db2.destroy()
  }
})

describe('reorder for slow movers', () => {
  it('decides the reorder point from Poisson demand over the lead time and says so in whole cutters', async () => {
    const row = await reorderRow(fx.typeId)
    const perDay = 10 / 90 / 2.6 // ten lives in the 90-day window, in cutters
    expect(row.dailyDemand).toBeCloseTo(perDay, 9)
    expect(row.leadTimeDemand).toBeCloseTo(perDay * 12, 9)
    expect(row.method).toBe('poisson')
    expect(row.reorderPoint).toBe(jstatReorderPoint(perDay * 12, 0.95))
    expect(Number.isInteger(row.suggestedQty)).toBe(true)
    expect(row.available).toBe(1)
    expect(row.belowReorderPoint).toBe(true)
    expect(row.explanation).toMatch(/^Order \d+\. You use about one every 23 days; delivery takes 12 days; 1 in the crib and spindles\. Without this order there is a 1-in-\d+ chance of running out before it arrives\.$/)
    expect(row.formulas.join('\n')).toContain('Poisson')
  })

  it('counts cutters at the regrinder as stock coming back when due back within the lead time', async () => {
    const [a, b] = await fx.add([{ lifeUsed: 0.95 }, { lifeUsed: 0.95 }])
    const before = await reorderRow(fx.typeId)
    const batch = (await shop.crib.post('/api/regrind/batches', { cutterIds: [a!.id, b!.id], supplierId: fx.supplier.id })).body.batch
    expect((await shop.crib.post(`/api/regrind/batches/${batch.id}/send`, {})).status).toBe(200)
    const after = await reorderRow(fx.typeId)
    // Both left the crib (2 fewer available) and are due back in 10 days, inside the 12-day lead time.
    expect(after.available).toBe(before.available - 2)
    expect(after.atRegrind).toBe(2)
    expect(after.position).toBe(before.position)
    expect(after.explanation).toContain('2 coming back from the regrinder')
    // A regrinder slower than the lead time: they no longer count (and the type is short again).
    const db = appDb()
    await db.updateTable('suppliers').set({ regrind_turnaround_days: 30 }).where('id', '=', fx.supplier.id).execute()
    await db.destroy()
    expect((await reorderRow(fx.typeId)).atRegrind).toBe(0)
  })

  it('ordering the suggested quantity leaves the type above its reorder point', async () => {
    const row = await reorderRow(fx.typeId)
    expect(row.belowReorderPoint).toBe(true)
    const order = await shop.crib.post('/api/orders', { supplierId: fx.supplier.id, lines: [{ typeId: fx.typeId, quantity: row.suggestedQty }] })
    expect((await shop.crib.post(`/api/orders/${order.body.id}/send`)).status).toBe(200)
    const after = await reorderRow(fx.typeId)
    expect(after.onOrder).toBe(row.suggestedQty)
    expect(after.position).toBeGreaterThan(after.reorderPoint)
    expect(after.belowReorderPoint).toBe(false)
    expect(after.suggestedQty).toBe(0)
    expect((await shop.crib.post(`/api/orders/${order.body.id}/cancel`)).status).toBe(200)
  })
})

describe('the shop\'s own word wins', () => {
  it('min/max decide when set, and the sentence says so', async () => {
    expect((await shop.crib.patch(`/api/cutter-types/${fx.typeId}`, { minOnHand: 8, maxOnHand: 12 })).status).toBe(200)
    const row = await reorderRow(fx.typeId)
    expect(row.method).toBe('min_max')
    expect(row.belowReorderPoint).toBe(true)
    expect(row.suggestedQty).toBe(12 - row.position)
    expect(row.explanation).toContain('You keep at least 8 and at most 12')
  })

  it('spares per machine decide when they ask for more: one in each spindle and N sharp ones waiting', async () => {
    expect((await shop.crib.patch(`/api/cutter-types/${fx.typeId}`, { minOnHand: null, maxOnHand: null, sparesPerMachine: 9 })).status).toBe(200)
    const row = await reorderRow(fx.typeId)
    expect(row.method).toBe('spares')
    expect(row.machinesUsing).toBe(1)
    expect(row.keepAtLeast).toBe(10)
    expect(row.suggestedQty).toBe(10 - row.position)
    expect(row.explanation).toContain('1 machine uses this type')
  })

  it('a type marked "do not reorder" is never suggested', async () => {
    expect((await shop.crib.patch(`/api/cutter-types/${fx.typeId}`, { sparesPerMachine: null, doNotReorder: true })).status).toBe(200)
    const row = await reorderRow(fx.typeId)
    expect(row).toMatchObject({ doNotReorder: true, belowReorderPoint: false, suggestedQty: 0 })
    expect(row.explanation).toMatch(/^Not reordered/)
    const made = await shop.crib.post('/api/orders/from-suggestions', { typeIds: [fx.typeId] })
    expect(made.body.orderIds).toEqual([])
    expect((await shop.crib.patch(`/api/cutter-types/${fx.typeId}`, { doNotReorder: false })).status).toBe(200)
  })
})

describe('bad input answers 400 naming the field', () => {
  const fieldOf = (res: { status: number, body: { message?: string, data?: { fields?: Record<string, string> } } }) => {
    expect(res.status).toBe(400)
    return Object.keys(res.body.data?.fields ?? {})
  }

  it('a minimum above the maximum, also when only one of them is sent', async () => {
    expect(fieldOf(await shop.crib.patch(`/api/cutter-types/${fx.typeId}`, { minOnHand: 5, maxOnHand: 4 }))).toContain('maxOnHand')
    expect((await shop.crib.patch(`/api/cutter-types/${fx.typeId}`, { maxOnHand: 4 })).status).toBe(200)
    expect(fieldOf(await shop.crib.patch(`/api/cutter-types/${fx.typeId}`, { minOnHand: 5 }))).toContain('maxOnHand')
    expect((await shop.crib.patch(`/api/cutter-types/${fx.typeId}`, { maxOnHand: null })).status).toBe(200)
  })

  it('a negative spare count', async () => {
    expect(fieldOf(await shop.crib.patch(`/api/cutter-types/${fx.typeId}`, { sparesPerMachine: -1 }))).toContain('sparesPerMachine')
  })

  it('a regrind turnaround of 0 or over 365 days', async () => {
    expect(fieldOf(await shop.crib.patch(`/api/suppliers/${fx.supplier.id}`, { regrindTurnaroundDays: 0 }))).toContain('regrindTurnaroundDays')
    expect(fieldOf(await shop.crib.patch(`/api/suppliers/${fx.supplier.id}`, { regrindTurnaroundDays: 366 }))).toContain('regrindTurnaroundDays')
    expect((await shop.crib.patch(`/api/suppliers/${fx.supplier.id}`, { regrindTurnaroundDays: 365 })).status).toBe(200)
    expect((await shop.crib.patch(`/api/suppliers/${fx.supplier.id}`, { regrindTurnaroundDays: 10 })).status).toBe(200)
  })

  it('an order with no lines, a price or a quantity beyond sane bounds', async () => {
    expect(fieldOf(await shop.crib.post('/api/orders', { supplierId: fx.supplier.id, lines: [] }))).toContain('lines')
    expect(fieldOf(await shop.crib.post('/api/orders', { supplierId: fx.supplier.id, lines: [{ typeId: fx.typeId, quantity: 10_001 }] }))).toContain('lines.0.quantity')
    expect(fieldOf(await shop.crib.post('/api/orders', { supplierId: fx.supplier.id, lines: [{ typeId: fx.typeId, quantity: 1, unitCostCents: 10_000_001 }] })))
      .toContain('lines.0.unitCostCents')
  })
})

describe('orders from scratch, with a purchase-order PDF', () => {
  let otherSupplierTypeId: number
  let orderId: number

  beforeAll(async () => {
    const created = await shop.crib.post('/api/cutter-types', {
      name: 'V-bit 60 degree engraving', profile: 'v_bit', vAngleDeg: 60, helix: 'straight', flutes: 2, cuttingDiameterMm: 12.7, shankDiameterMm: 6.35,
      cuttingLengthMm: 11, overallLengthMm: 50, ratedLifeMinutes: 900, minUsableDiameterMm: 12, unitCostCents: 2450, supplierPartNumber: 'VB-60-12',
    })
    expect(created.status).toBe(201)
    otherSupplierTypeId = created.body.id
  })

  it('a crib manager starts an order to any supplier with any types, edits it and sends it with the PDF attached', async () => {
    const started = await shop.crib.post('/api/orders', {
      supplierId: fx.supplier.id, note: 'Call before delivery',
      lines: [{ typeId: fx.typeId, quantity: 4, unitCostCents: 3850 }, { typeId: otherSupplierTypeId, quantity: 2 }],
    })
    expect(started.status).toBe(201)
    orderId = started.body.id
    expect(started.body.lines).toHaveLength(2)
    const edited = await shop.crib.patch(`/api/orders/${orderId}`, { lines: [{ typeId: fx.typeId, quantity: 6, unitCostCents: 3850 }, { typeId: otherSupplierTypeId, quantity: 3, unitCostCents: 2400 }] })
    expect(edited.status).toBe(200)
    // 6 × $38.50 + 3 × $24.00 = $231.00 + $72.00 = $303.00
    expect(edited.body.totalCents).toBe(30300)
    const sent = await shop.crib.post(`/api/orders/${orderId}/send`)
    expect(sent.status).toBe(200)
    const mail = await waitForMail(fx.supplier.email, sent.body.number)
    expect(mail.text).toContain(`Deliver to:\n${shopName}`)
    expect(mail.attachments).toHaveLength(1)
    expect(mail.attachments[0]).toMatchObject({ filename: `purchase-order-${sent.body.number}.pdf`, contentType: 'application/pdf' })
    const text = await pdfText(Buffer.from(mail.attachments[0]!.contentBase64, 'base64'))
    expect(text).toContain(sent.body.number)
    expect(text).toContain('$303.00')
  })

  it('the same PDF downloads from GET /api/orders/:id/pdf, with the lines, totals and delivery address', async () => {
    const res = await shop.crib.raw(`/api/orders/${orderId}/pdf`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('application/pdf')
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="purchase-order-PO-\d+\.pdf"$/)
    const text = await pdfText(new Uint8Array(await res.arrayBuffer()))
    const lines = text.split('\n').map((l) => l.trim())
    expect(text).toContain('Purchase order')
    expect(text).toContain('Test Regrind Works')
    expect(lines.some((l) => /^6\b.*Two-flute upcut 1\/4" regrindable.*\$38\.50.*\$231\.00$/.test(l))).toBe(true)
    expect(lines.some((l) => /^3\b.*VB-60-12.*V-bit 60 degree engraving.*\$24\.00.*\$72\.00$/.test(l))).toBe(true)
    expect(text).toContain('Order total: $303.00')
    expect(text).toContain('DELIVER TO')
    expect(text).toContain(shopName)
    expect(text).toContain('Call before delivery')
  })

  it('is the crib\'s, and another shop\'s order is not found', async () => {
    expect((await shop.operator.raw(`/api/orders/${orderId}/pdf`)).status).toBe(403)
    const nosy = await makeShop('Nosy PDF')
    expect((await nosy.crib.raw(`/api/orders/${orderId}/pdf`)).status).toBe(404)
  })
})

describe('regrind batches received in part', () => {
  it('receives some bits, writes off one the regrinder scrapped, and stays open until every bit is back', async () => {
    const cutters = await fx.add([{ lifeUsed: 0.95 }, { lifeUsed: 0.95 }, { lifeUsed: 0.95 }])
    const batch = (await shop.crib.post('/api/regrind/batches', { cutterIds: cutters.map((c) => c.id), supplierId: fx.supplier.id })).body.batch
    expect((await shop.crib.post(`/api/regrind/batches/${batch.id}/send`, {})).status).toBe(200)

    const first = await shop.crib.post(`/api/regrind/batches/${batch.id}/receive`, { items: [{ cutterId: cutters[0]!.id, diameterMm: 6.2 }] })
    expect(first.status).toBe(200)
    expect(first.body.batch.status).toBe('sent')
    expect(first.body.batch.totals).toMatchObject({ items: 3, reground: 1, out: 2 })
    expect(first.body.receipt).toMatchObject({ reground: 1, stillOut: 2 })
    expect((await cutterState(cutters[1]!.id)).cutter.status).toBe('at_regrind')

    // The same bit twice is refused, naming the item.
    const twice = await shop.crib.post(`/api/regrind/batches/${batch.id}/receive`, { items: [{ cutterId: cutters[0]!.id, diameterMm: 6.2 }] })
    expect(twice.status).toBe(400)
    expect(Object.keys(twice.body.data.fields)).toEqual(['items.0.cutterId'])

    const second = await shop.crib.post(`/api/regrind/batches/${batch.id}/receive`, {
      items: [{ cutterId: cutters[1]!.id, scrapReason: 'Cracked flute' }, { cutterId: cutters[2]!.id, diameterMm: 6.19 }],
    })
    expect(second.status).toBe(200)
    expect(second.body.batch.status).toBe('received')
    expect(second.body.batch.totals).toMatchObject({ reground: 2, retired: 1, scrapped: 1, out: 0 })
    const scrapped = await cutterState(cutters[1]!.id)
    expect(scrapped.cutter).toMatchObject({ status: 'retired', retired_reason: 'other' })
    expect(scrapped.events.at(-1)!.note).toContain('Scrapped by the regrinder: Cracked flute')
    expect(scrapped.items.at(-1)).toMatchObject({ result: 'retired', scrap_reason: 'Cracked flute' })
  })

  it('a bit neither measured nor scrapped is a 400 naming the item', async () => {
    const res = await shop.crib.post('/api/regrind/batches/1/receive', { items: [{ cutterId: 1 }] })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields)).toContain('items.0.diameterMm')
  })

  it('shows each open batch\'s age against the turnaround, and the morning report names the overdue ones', async () => {
    const [late] = await fx.add([{ lifeUsed: 0.95 }])
    const batch = (await shop.crib.post('/api/regrind/batches', { cutterIds: [late!.id], supplierId: fx.supplier.id })).body.batch
    expect((await shop.crib.post(`/api/regrind/batches/${batch.id}/send`, {})).status).toBe(200)
    const db = appDb()
    await db.updateTable('regrind_batches').set({ sent_at: new Date(Date.now() - 13 * DAY - 60_000) }).where('id', '=', batch.id).execute()
    await db.destroy()
    const list = (await shop.crib.get('/api/regrind/batches')).body
    const row = list.find((b: { id: number }) => b.id === batch.id)
    expect(row.age).toMatchObject({ ageDays: 13, turnaroundDays: 10, overdue: true, daysOverdue: 3 })
    expect(row.counts.out).toBe(1)
    const report = await shop.owner.post('/api/reports/run')
    expect(report.status).toBeLessThan(300)
    const mail = await waitForMail(shop.emails.owner, 'Tooling report')
    expect(mail.text).toContain(`Batch ${batch.id}: 1 of 1 still out, sent 13 days ago to Test Regrind Works, 3 days past the 10-day turnaround`)
  })
})

describe('the owner\'s view of stock', () => {
  it('money tied up per type is the sharp cutters times the unit cost; stock-outs are days without one while its materials were cut', async () => {
    const owner = await makeShop('Stock view')
    const ofx = await addRegrindFixture(owner.id, `stock-${randomUUID().slice(0, 8)}@example.com`)
    const [only] = await ofx.add([{ lifeUsed: 0.2 }])
    const db = appDb()
    try {
      const mdf = await db.selectFrom('materials').select('id').where('shop_id', '=', owner.id).where('name', '=', 'MDF').executeTakeFirstOrThrow()
      const now = Date.now()
      // The only cutter arrived 40 days ago, was lost 20 days ago and found 15 days ago: days 20 to 15
      // ago (6 days) had none. MDF was cut on 3 of those days (with the same cutter's record, as a late entry would be) and on days it was there.
      await db.insertInto('cutter_events').values([
        { shop_id: owner.id, cutter_id: only!.id, kind: 'received', from_status: null, to_status: 'in_crib', created_at: new Date(now - 40 * DAY) },
        { shop_id: owner.id, cutter_id: only!.id, kind: 'lost', from_status: 'in_crib', to_status: 'lost', created_at: new Date(now - 20 * DAY) },
        { shop_id: owner.id, cutter_id: only!.id, kind: 'found', from_status: 'lost', to_status: 'in_crib', created_at: new Date(now - 15 * DAY) },
      ]).execute()
      await db.insertInto('cut_logs').values([30, 19, 18, 16, 10].map((d) => ({
        shop_id: owner.id, cutter_id: only!.id, material_id: mdf.id, minutes: 5, wear_factor: 1, life_added: 5 / 600,
        outcome: 'clean' as const, idempotency_key: `stock-${owner.id}-${d}`, cut_at: new Date(now - d * DAY),
      }))).execute()
    } finally {
      await db.destroy()
    }
    expect((await owner.crib.get('/api/insights/stock')).status).toBe(403)
    const res = await owner.owner.get('/api/insights/stock')
    expect(res.status).toBe(200)
    const row = res.body.rows.find((r: { typeId: number }) => r.typeId === ofx.typeId)
    expect(row).toMatchObject({ inStock: 1, unitCostCents: 3900, tiedUpCents: 3900, stockOutDays: 3 })
    expect(res.body.totalTiedUpCents).toBe(3900)
  })
})
