// The crib's row actions (lost, found, retire, clear a dull flag) and a cutter's history: each
// change is one event with who made it, impossible changes answer 409, and other shops get 404.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import type { Client } from '../support/http'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let other: TestShop
let fx: SpindleFixture
let otherFx: SpindleFixture
let mdf: number

const ACTIONS = ['lost', 'found', 'retire', 'unflag'] as const
const act = (client: Client, id: number, action: (typeof ACTIONS)[number], body?: Record<string, unknown>) =>
  client.post(`/api/cutters/${id}/${action}`, body ?? (action === 'retire' ? { reason: 'worn' } : {}))

async function events(cutterId: number) {
  const db = appDb()
  try {
    return await db.selectFrom('cutter_events').select(['kind', 'from_status', 'to_status', 'actor_id', 'machine_id', 'note'])
      .where('cutter_id', '=', cutterId).orderBy('id').execute()
  } finally {
    await db.destroy()
  }
}

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Crib actions'), makeShop('Far away')])
  ;[fx, otherFx] = await Promise.all([addSpindleFixture(shop.id, 8), addSpindleFixture(other.id, 1)])
  mdf = (await shop.operator.get('/api/materials')).body.find((m: { name: string }) => m.name === 'MDF').id
})

describe('lost and found', () => {
  it('a cutter in the crib goes lost and comes back, each step an event by the crib manager', async () => {
    const c = fx.cutters[0]!
    const lost = await act(shop.crib, c.id, 'lost', { note: 'not in its slot at the count' })
    expect(lost.status).toBe(200)
    expect(lost.body.cutter).toMatchObject({ id: c.id, status: 'lost', machine: null })
    const found = await act(shop.crib, c.id, 'found')
    expect(found.body.cutter).toMatchObject({ status: 'in_crib' })
    expect((await events(c.id)).map((e) => [e.kind, e.from_status, e.to_status, e.actor_id])).toEqual([
      ['lost', 'in_crib', 'lost', shop.ids.crib],
      ['found', 'lost', 'in_crib', shop.ids.crib],
    ])
  })

  it('a cutter lost from a machine leaves the machine', async () => {
    const c = fx.cutters[1]!
    await shop.operator.post(`/api/cutters/${c.id}/load`, { machineId: fx.machines.changer })
    const res = await act(shop.crib, c.id, 'lost')
    expect(res.body.cutter).toMatchObject({ status: 'lost', machine: null })
    expect((await events(c.id)).at(-1)).toMatchObject({ kind: 'lost', from_status: 'in_spindle', machine_id: fx.machines.changer })
  })

  it('finding a cutter that is not lost, or losing one twice, answers 409 and changes nothing', async () => {
    const c = fx.cutters[2]!
    const found = await act(shop.crib, c.id, 'found')
    expect(found.status).toBe(409)
    expect(found.body.message).toBe(`Cutter ${c.code} is in the crib, not marked lost, so it cannot be found.`)
    await act(shop.crib, c.id, 'lost')
    const again = await act(shop.crib, c.id, 'lost')
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/is marked lost/)
    expect((await events(c.id)).map((e) => e.kind)).toEqual(['lost'])
  })
})

describe('retiring', () => {
  it('retires a cutter as worn with the note, and refuses to retire it twice', async () => {
    const c = fx.cutters[3]!
    const res = await act(shop.crib, c.id, 'retire', { reason: 'worn', note: 'edge chipped past regrinding' })
    expect(res.status).toBe(200)
    expect(res.body.cutter).toMatchObject({ status: 'retired', retiredReason: 'worn', due: null })
    expect((await events(c.id)).at(-1)).toMatchObject({ kind: 'retired', to_status: 'retired', note: 'edge chipped past regrinding', actor_id: shop.ids.crib })
    const again = await act(shop.crib, c.id, 'retire', { reason: 'other' })
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/is retired/)
    expect((await act(shop.crib, c.id, 'lost')).status).toBe(409)
  })

  it('asks for a reason it knows', async () => {
    const res = await act(shop.crib, fx.cutters[4]!.id, 'retire', { reason: 'broken' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.reason).toBe('choose worn or other')
  })
})

describe('clearing a dull flag', () => {
  it('clears a flag set by mistake, so the cutter is no longer due; a second try answers 409', async () => {
    const c = fx.cutters[4]!
    await shop.operator.post(`/api/cutters/${c.id}/flag`, { kind: 'dull' })
    const res = await act(shop.crib, c.id, 'unflag', { note: 'wrong bit scanned' })
    expect(res.status).toBe(200)
    expect(res.body.cutter).toMatchObject({ status: 'in_crib', flagged: null, flaggedAt: null, due: null })
    expect((await events(c.id)).at(-1)).toMatchObject({ kind: 'edited', note: 'Dull flag cleared: wrong bit scanned', actor_id: shop.ids.crib })
    const again = await act(shop.crib, c.id, 'unflag')
    expect(again.status).toBe(409)
    expect(again.body.message).toBe(`Cutter ${c.code} is not flagged dull, so there is no flag to clear.`)
  })
})

describe('history', () => {
  it('lists events and cut logs newest first, with who, where and what', async () => {
    const c = fx.cutters[5]!
    const cut = (minutes: number, note: string) => shop.operator.post(`/api/cutters/${c.id}/cuts`, {
      idempotencyKey: `test-${randomUUID()}`, materialId: mdf, minutes, outcome: 'clean', rpm: 18000, feedMmPerMin: 3000, note,
    })
    await shop.operator.post(`/api/cutters/${c.id}/load`, { machineId: fx.machines.changer })
    await cut(30, 'first sheet')
    await cut(45, 'second sheet')
    await shop.operator.post(`/api/cutters/${c.id}/return`)
    await act(shop.crib, c.id, 'lost')

    const res = await shop.crib.get(`/api/cutters/${c.id}/history`)
    expect(res.status).toBe(200)
    expect(res.body.total).toBe(5)
    const entries = res.body.entries as Array<Record<string, any>>
    expect(entries.map((e) => e.kind ?? `cut ${e.minutes}`)).toEqual(['lost', 'returned', 'cut 45', 'cut 30', 'loaded'])
    expect(entries.map((e) => Date.parse(e.at))).toEqual(entries.map((e) => Date.parse(e.at)).sort((a, b) => b - a))
    expect(entries[0]).toMatchObject({ source: 'event', who: 'Test Crib', fromStatus: 'in_crib', toStatus: 'lost', photoId: null })
    expect(entries[2]).toMatchObject({
      source: 'cut', who: 'Test Operator', machineName: 'Big table with changer', materialName: 'MDF', minutes: 45,
      outcome: 'clean', rpm: 18000, feedMmPerMin: 3000, note: 'second sheet',
    })
    expect(entries[4]).toMatchObject({ kind: 'loaded', who: 'Test Operator', machineName: 'Big table with changer' })

    const paged = await shop.crib.get(`/api/cutters/${c.id}/history?pageSize=2&page=3`)
    expect(paged.body).toMatchObject({ total: 5, page: 3, pageSize: 2 })
    expect(paged.body.entries.map((e: { kind: string }) => e.kind)).toEqual(['loaded'])
  })

  it('shows the photo of a dull flag', async () => {
    const c = fx.cutters[6]!
    const db = appDb()
    try {
      const photo = await db.insertInto('uploads').values({
        shop_id: shop.id, storage_key: `photos/test-${randomUUID()}.png`, kind: 'photo', content_type: 'image/png', size_bytes: 10,
      }).returning('id').executeTakeFirstOrThrow()
      await db.insertInto('cutter_events').values({
        shop_id: shop.id, cutter_id: c.id, kind: 'flagged_dull', actor_id: shop.ids.operator, photo_id: photo.id, note: 'fuzzy edge',
      }).execute()
      const res = await shop.crib.get(`/api/cutters/${c.id}/history`)
      expect(res.body.entries[0]).toMatchObject({ kind: 'flagged_dull', photoId: photo.id, who: 'Test Operator', note: 'fuzzy edge' })
    } finally {
      await db.destroy()
    }
  })
})

describe('who may act', () => {
  it('another shop gets 404 for the history and every row action, and nothing changes', async () => {
    const c = fx.cutters[7]!
    expect((await other.crib.get(`/api/cutters/${c.id}/history`)).status).toBe(404)
    for (const action of ACTIONS) {
      const res = await act(other.crib, c.id, action)
      expect(res.status).toBe(404)
      expect(res.body.message).toBe('No such cutter in your shop.')
    }
    expect(await events(c.id)).toEqual([])
    expect((await other.crib.get(`/api/cutters/${otherFx.cutters[0]!.id}/history`)).status).toBe(200)
  })
})
