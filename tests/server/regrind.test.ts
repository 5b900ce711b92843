// Resharpening: the due list, a batch drafted, sent and received back, the retire-instead rule
// at its boundaries, and the new sharp life that follows. Each cutter counts once, in one batch.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import type { Client } from '../support/http'
import { waitForMail } from '../support/http'
import { makeShop, type TestShop } from '../support/shops'
import { addRegrindFixture, cutterState, REGRIND_TYPE, type RegrindFixture } from '../support/regrind'

const FRACTION = 0.75 // the test shop's regrind life fraction, not the default, so it must be read
let shop: TestShop
let other: TestShop
let fx: RegrindFixture
let otherFx: RegrindFixture

const send = (client: Client, batchId: number, body: Record<string, unknown> = {}) => client.post(`/api/regrind/batches/${batchId}/send`, body)
const draft = (client: Client, cutterIds: number[], supplierId: number | null = fx.supplier.id) =>
  client.post('/api/regrind/batches', { cutterIds, supplierId, note: 'test run' })

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Regrind'), makeShop('Elsewhere')])
  ;[fx, otherFx] = await Promise.all([
    addRegrindFixture(shop.id, `regrind-${randomUUID().slice(0, 8)}@example.com`),
    addRegrindFixture(other.id, 'other-regrind@example.com'),
  ])
  const db = appDb()
  await db.updateTable('shops').set({ regrind_life_fraction: FRACTION }).where('id', '=', shop.id).execute()
  await db.destroy()
})

describe('the round trip: due list, batch, send, receive back', () => {
  it('due cutters out, sharp cutters back with a new, shorter life', async () => {
    const [worn, dull, fine, usedUp, small] = await fx.add([
      { lifeUsed: 0.95 },
      { lifeUsed: 0.2, flagged: 'dull', status: 'in_spindle' },
      { lifeUsed: 0.5 },
      { lifeUsed: 0.95, regrindCount: 2, diameterMm: 6.05 },
      { lifeUsed: 0.92, diameterMm: 6.1 }, // 6.1 − 0.15 = 5.95 < 6.0
    ])

    const due = await shop.crib.get('/api/regrind/due')
    expect(due.status).toBe(200)
    expect(due.body.suppliers).toEqual([{ id: fx.supplier.id, name: 'Test Regrind Works', email: fx.supplier.email }])
    expect(due.body.regrindLifeFraction).toBe(FRACTION)
    const byId = new Map(due.body.cutters.map((c: { id: number }) => [c.id, c]))
    expect(byId.has(fine!.id)).toBe(false)
    expect(byId.get(worn!.id)).toMatchObject({
      code: worn!.code, typeId: fx.typeId, status: 'in_crib', lifeUsed: 0.95, diameterMm: 6.35, diameterAfterMm: 6.2,
      regrindCount: 0, maxRegrinds: 2, minUsableDiameterMm: 6, reason: 'life_used', action: 'resharpen', retireReason: null, openBatchId: null,
    })
    expect(byId.get(dull!.id)).toMatchObject({ reason: 'flagged_dull', action: 'resharpen', status: 'in_spindle', machineName: 'Test table' })
    expect(byId.get(usedUp!.id)).toMatchObject({ action: 'retire', retireReason: 'Its regrinds are used up (2 of 2).' })
    expect(byId.get(small!.id)).toMatchObject({ action: 'retire', retireReason: expect.stringMatching(/below the minimum usable diameter/) })
    // The home page reads the same query.
    const home = (await shop.crib.get('/api/dashboard')).body.due.map((c: { id: number }) => c.id)
    expect(home.sort()).toEqual([...byId.keys()].sort())

    const created = await draft(shop.crib, [worn!.id, dull!.id, worn!.id])
    expect(created.status).toBe(201)
    expect(created.body.warnings).toEqual([])
    const batch = created.body.batch
    expect(batch).toMatchObject({ status: 'draft', supplier: { id: fx.supplier.id }, note: 'test run', totals: { items: 2 } })
    const marked = (await shop.crib.get('/api/regrind/due')).body.cutters.find((c: { id: number }) => c.id === worn!.id)
    expect(marked.openBatchId).toBe(batch.id)

    const sent = await send(shop.crib, batch.id, { emailSupplier: true })
    expect(sent.status).toBe(200)
    expect(sent.body.batch.status).toBe('sent')
    expect(sent.body.batch.sentAt).toBeTruthy()
    expect(sent.body.mail).toEqual({ sent: true, to: fx.supplier.email, problem: null })
    const mail = await waitForMail(fx.supplier.email, `batch ${batch.number}`)
    expect(mail.text).toContain(worn!.code)
    expect(mail.text).toContain(dull!.code)
    for (const c of [worn!, dull!]) {
      const { cutter, events } = await cutterState(c.id)
      expect(cutter).toMatchObject({ status: 'at_regrind', machine_id: null })
      expect(events.at(-1)).toMatchObject({ kind: 'sent_to_regrind', to_status: 'at_regrind' })
    }
    expect((await cutterState(dull!.id)).events.at(-1)).toMatchObject({ from_status: 'in_spindle', machine_id: fx.machineId })
    const stillDue = (await shop.crib.get('/api/regrind/due')).body.cutters.map((c: { id: number }) => c.id)
    expect(stillDue).not.toContain(worn!.id)

    const received = await shop.crib.post(`/api/regrind/batches/${batch.id}/receive`, {
      items: [{ cutterId: worn!.id, diameterMm: 6.2 }, { cutterId: dull!.id, diameterMm: 6.18, costCents: 1650 }],
    })
    expect(received.status).toBe(200)
    expect(received.body.batch).toMatchObject({ status: 'received', totals: { items: 2, reground: 2, retired: 0, costCents: REGRIND_TYPE.regrindCostCents + 1650 } })
    expect(received.body.batch.receivedAt).toBeTruthy()
    for (const [c, diameter] of [[worn!, 6.2], [dull!, 6.18]] as const) {
      const { cutter, events, items } = await cutterState(c.id)
      expect(cutter).toMatchObject({
        status: 'in_crib', regrind_count: 1, diameter_mm: diameter, life_used: 0, life_scale: FRACTION, minutes_this_life: 0, flagged: null, flagged_at: null,
      })
      expect(events.at(-1)).toMatchObject({ kind: 'reground', from_status: 'at_regrind', to_status: 'in_crib' })
      expect(items[0]).toMatchObject({ diameter_before_mm: 6.35, diameter_after_mm: diameter, result: 'reground' })
    }
    expect((await cutterState(worn!.id)).items[0]!.cost_cents).toBe(REGRIND_TYPE.regrindCostCents)
    expect((await cutterState(dull!.id)).items[0]!.cost_cents).toBe(1650)

    const again = await shop.crib.post(`/api/regrind/batches/${batch.id}/receive`, { items: [{ cutterId: worn!.id, diameterMm: 6.2 }] })
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/already received/)

    const list = (await shop.crib.get('/api/regrind/batches')).body
    expect(list.find((b: { id: number }) => b.id === batch.id)).toMatchObject({ status: 'received', counts: { items: 2, reground: 2, retired: 0 } })

    // The new life, by the Palmgren–Miner linear damage rule with the life scaled after a
    // regrind: life used = minutes × wear factor / (rated life × regrind life fraction).
    const mdf = (await shop.operator.get('/api/materials')).body.find((m: { name: string }) => m.name === 'MDF')
    expect((await shop.operator.post(`/api/cutters/${worn!.id}/load`, { machineId: fx.machineId })).status).toBe(200)
    const cut = await shop.operator.post(`/api/cutters/${worn!.id}/cuts`, { idempotencyKey: `test-${randomUUID()}`, materialId: mdf.id, minutes: 90, outcome: 'clean' })
    expect(cut.status).toBe(201)
    expect(cut.body.lifeUsed).toBeCloseTo((90 * mdf.wearFactor) / (REGRIND_TYPE.ratedLifeMinutes * FRACTION), 5)
  })
})

describe('retire instead of regrind, at the boundary', () => {
  it('exactly the minimum is reground; 0.001 mm below and past the maximum regrinds are retired', async () => {
    const [atMin, below, lastOne, pastMax] = await fx.add([
      { lifeUsed: 1 }, { lifeUsed: 1 }, { lifeUsed: 1, regrindCount: 1, diameterMm: 6.2 }, { lifeUsed: 1, regrindCount: 2, diameterMm: 6.2 },
    ])
    const created = await draft(shop.crib, [atMin!.id, below!.id, lastOne!.id, pastMax!.id])
    expect(created.status).toBe(201)
    // The crib manager may send a cutter due to be retired, with a warning saying why.
    expect(created.body.warnings).toEqual([{ cutterId: pastMax!.id, code: pastMax!.code, message: expect.stringMatching(/retired rather than resharpened/) }])
    const batchId = created.body.batch.id
    expect((await send(shop.crib, batchId)).body.mail).toBeNull()

    const res = await shop.crib.post(`/api/regrind/batches/${batchId}/receive`, {
      items: [
        { cutterId: atMin!.id, diameterMm: 6.0 },
        { cutterId: below!.id, diameterMm: 5.999 },
        { cutterId: lastOne!.id, diameterMm: 6.05 },
        { cutterId: pastMax!.id, diameterMm: 6.05 },
      ],
    })
    expect(res.status).toBe(200)
    expect(res.body.batch.totals).toMatchObject({ reground: 2, retired: 2 })
    expect((await cutterState(atMin!.id)).cutter).toMatchObject({ status: 'in_crib', diameter_mm: 6, regrind_count: 1 })
    expect((await cutterState(lastOne!.id)).cutter).toMatchObject({ status: 'in_crib', diameter_mm: 6.05, regrind_count: 2 })

    const small = await cutterState(below!.id)
    expect(small.cutter).toMatchObject({ status: 'retired', retired_reason: 'undersize', diameter_mm: 5.999, regrind_count: 0 })
    expect(small.events.at(-1)).toMatchObject({ kind: 'retired', from_status: 'at_regrind', to_status: 'retired' })
    expect(small.items[0]).toMatchObject({ result: 'retired', diameter_after_mm: 5.999 })
    const worn = await cutterState(pastMax!.id)
    expect(worn.cutter).toMatchObject({ status: 'retired', retired_reason: 'worn', regrind_count: 2 })
    expect(worn.events.at(-1)!.note).toMatch(/past the 2 this type allows/)
  })
})

describe('one batch at a time', () => {
  it('sending twice: the second answers 409', async () => {
    const [c] = await fx.add([{ lifeUsed: 0.95 }])
    const batchId = (await draft(shop.crib, [c!.id])).body.batch.id
    const [a, b] = await Promise.all([send(shop.crib, batchId), send(shop.crib, batchId)])
    expect([a.status, b.status].sort()).toEqual([200, 409])
    expect((await send(shop.crib, batchId)).body.message).toMatch(/is out at the regrinder/)
    expect((await cutterState(c!.id)).events.filter((e) => e.kind === 'sent_to_regrind')).toHaveLength(1)
  })

  it('a cutter in two batches: the second draft and an added cutter answer 409', async () => {
    const [c, d] = await fx.add([{ lifeUsed: 0.95 }, { lifeUsed: 0.95 }])
    const firstBatch = (await draft(shop.crib, [c!.id])).body.batch
    const first = firstBatch.id
    const clash = await draft(shop.crib, [d!.id, c!.id])
    expect(clash.status).toBe(409)
    expect(clash.body.message).toContain(`${c!.code} (batch ${firstBatch.number})`)
    const second = (await draft(shop.crib, [d!.id])).body.batch.id
    expect((await shop.crib.patch(`/api/regrind/batches/${second}`, { addCutterIds: [c!.id] })).status).toBe(409)
    // Once the first draft is cancelled the cutter is free again.
    expect((await shop.crib.post(`/api/regrind/batches/${first}/cancel`)).body.batch.status).toBe('cancelled')
    const moved = await shop.crib.patch(`/api/regrind/batches/${second}`, { addCutterIds: [c!.id], removeCutterIds: [d!.id] })
    expect(moved.status).toBe(200)
    expect(moved.body.batch.items.map((i: { cutterId: number }) => i.cutterId)).toEqual([c!.id])
  })

  it('a cutter that changed since the draft stops the send, named', async () => {
    const [c, d] = await fx.add([{ lifeUsed: 0.95 }, { lifeUsed: 0.95 }])
    const batchId = (await draft(shop.crib, [c!.id, d!.id])).body.batch.id
    expect((await shop.operator.post(`/api/cutters/${d!.id}/flag`, { kind: 'broken' })).status).toBe(200)
    const res = await send(shop.crib, batchId)
    expect(res.status).toBe(409)
    expect(res.body.message).toContain(`${d!.code} is retired`)
    expect((await cutterState(c!.id)).cutter.status).toBe('in_crib')
  })

  it('not-due cutters go with a warning; retired or away ones are refused', async () => {
    const [fresh, gone] = await fx.add([{ lifeUsed: 0.3 }, { status: 'retired' }])
    const ok = await draft(shop.crib, [fresh!.id], null)
    expect(ok.status).toBe(201)
    expect(ok.body.warnings[0].message).toBe(`${fresh!.code} is not due yet: 30 % of its life used.`)
    const refused = await draft(shop.crib, [gone!.id])
    expect(refused.status).toBe(409)
    expect(refused.body.message).toContain(`${gone!.code} is retired`)
  })

  it('a draft can change supplier and note; without a supplier address nothing is e-mailed, and the send says so', async () => {
    const [c] = await fx.add([{ lifeUsed: 0.95 }])
    const batchId = (await draft(shop.crib, [c!.id])).body.batch.id
    const edited = await shop.crib.patch(`/api/regrind/batches/${batchId}`, { supplierId: null, note: 'rush job' })
    expect(edited.body.batch).toMatchObject({ supplier: null, note: 'rush job' })
    const res = await send(shop.crib, batchId, { emailSupplier: true })
    expect(res.status).toBe(200)
    expect(res.body.mail).toMatchObject({ sent: false, problem: expect.stringMatching(/no e-mail address/) })
    expect((await shop.crib.patch(`/api/regrind/batches/${batchId}`, { note: 'too late' })).status).toBe(409)
    expect((await shop.crib.post(`/api/regrind/batches/${batchId}/cancel`)).body.message).toMatch(/Receive it back instead/)
  })

  it('a receipt names each cutter still out once; the others stay out', async () => {
    const [c, d] = await fx.add([{ lifeUsed: 0.95 }, { lifeUsed: 0.95 }])
    const batchId = (await draft(shop.crib, [c!.id, d!.id])).body.batch.id
    expect((await shop.crib.post(`/api/regrind/batches/${batchId}/receive`, { items: [{ cutterId: c!.id, diameterMm: 6.2 }] })).status).toBe(409)
    await send(shop.crib, batchId)
    const bad = await shop.crib.post(`/api/regrind/batches/${batchId}/receive`, { items: [{ cutterId: c!.id, diameterMm: 0 }, { cutterId: d!.id, diameterMm: 6.2 }] })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields['items.0.diameterMm']).toBeTruthy()
    const twice = await shop.crib.post(`/api/regrind/batches/${batchId}/receive`, { items: [{ cutterId: c!.id, diameterMm: 6.2 }, { cutterId: c!.id, diameterMm: 6.2 }] })
    expect(twice.status).toBe(400)
    expect(twice.body.data.fields['items.1.cutterId']).toMatch(/listed twice/)
    expect((await cutterState(c!.id)).cutter.status).toBe('at_regrind')
    const partial = await shop.crib.post(`/api/regrind/batches/${batchId}/receive`, { items: [{ cutterId: c!.id, diameterMm: 6.2 }] })
    expect(partial.status).toBe(200)
    expect(partial.body.batch).toMatchObject({ status: 'sent', totals: { items: 2, reground: 1, out: 1 } })
    expect((await cutterState(d!.id)).cutter.status).toBe('at_regrind')
  })
})

describe('who may', () => {
  const routes = (batchId: number, cutterId: number): Array<[string, string, unknown?]> => [
    ['GET', '/api/regrind/due'],
    ['GET', '/api/regrind/batches'],
    ['GET', `/api/regrind/batches/${batchId}`],
    ['POST', '/api/regrind/batches', { cutterIds: [cutterId] }],
    ['PATCH', `/api/regrind/batches/${batchId}`, { note: 'x' }],
    ['POST', `/api/regrind/batches/${batchId}/send`, {}],
    ['POST', `/api/regrind/batches/${batchId}/receive`, { items: [{ cutterId, diameterMm: 6.2 }] }],
    ['POST', `/api/regrind/batches/${batchId}/cancel`, {}],
  ]
  let batchId: number
  let cutterId: number
  beforeAll(async () => {
    const [c] = await fx.add([{ lifeUsed: 0.95 }])
    cutterId = c!.id
    batchId = (await draft(shop.crib, [cutterId])).body.batch.id
  })

  it('another shop\'s batch and cutter ids answer 404, and change nothing', async () => {
    for (const [method, path, body] of routes(batchId, cutterId).slice(2)) {
      const res = await other.crib.request(method, path, body)
      expect(res.status, `${method} ${path}`).toBe(404)
    }
    expect((await shop.crib.get(`/api/regrind/batches/${batchId}`)).body.status).toBe('draft')
    const [theirs] = await otherFx.add([{ lifeUsed: 0.95 }])
    expect((await draft(shop.crib, [theirs!.id])).status).toBe(404)
    const foreignSupplier = await draft(shop.crib, [cutterId], otherFx.supplier.id)
    expect(foreignSupplier.status).toBe(400)
    expect(foreignSupplier.body.data.fields.supplierId).toMatch(/no such supplier/)
    const listed = (await other.crib.get('/api/regrind/batches')).body.map((b: { id: number }) => b.id)
    expect(listed).not.toContain(batchId)
  })

  it('owners may', async () => {
    expect((await shop.owner.get('/api/regrind/due')).status).toBe(200)
  })
})
