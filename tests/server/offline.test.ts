// The phone without signal: the copy of the shop it keeps shows each cutter as the server does,
// holds only the person's own shop, and a load or return sent again with its key is done once.
import { randomUUID } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { cutterFromCopy, type OfflineCopy } from '../../shared/kerf/offline-copy'
import { appDb } from '../support/db'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let other: TestShop
let fx: SpindleFixture
let otherFx: SpindleFixture

const key = () => `phone-${randomUUID()}`

async function eventsOf(cutterId: number) {
  const db = appDb()
  try {
    return await db.selectFrom('cutter_events').select(['kind', 'idempotency_key']).where('cutter_id', '=', cutterId).orderBy('id').execute()
  } finally {
    await db.destroy()
  }
}

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Offline'), makeShop('Offline other')])
  ;[fx, otherFx] = await Promise.all([addSpindleFixture(shop.id, 3, 600), addSpindleFixture(other.id, 2, 600)])
})

describe('the copy of the shop a phone keeps', () => {
  it('shows every cutter as its page does: status, machine, life, remaining minutes by material, due notice', async () => {
    const [first, second] = fx.cutters
    expect((await shop.operator.post(`/api/cutters/${first!.id}/load`, { machineId: fx.machines.changer })).status).toBe(200)
    const materials = (await shop.operator.get('/api/materials')).body as Array<{ id: number, name: string }>
    const acrylic = materials.find((m) => m.name === 'Cast acrylic')!
    expect((await shop.operator.post(`/api/cutters/${first!.id}/cuts`, { idempotencyKey: key(), materialId: acrylic.id, minutes: 95, outcome: 'clean' })).status).toBe(201)

    const res = await shop.operator.get('/api/offline/copy')
    expect(res.status).toBe(200)
    expect(res.headers.get('cache-control')).toBe('private, no-store')
    const copy = res.body as OfflineCopy
    expect(copy.user).toEqual({ id: shop.ids.operator, shopId: shop.id, name: 'Test Operator', role: 'operator' })
    expect(Date.now() - Date.parse(copy.takenAt)).toBeLessThan(60_000)
    expect(copy.shop.shiftMinutes).toBe(720)

    for (const cutter of [first!, second!]) {
      const page = (await shop.operator.get(`/api/cutters/by-code/${cutter.code}`)).body
      const kept = cutterFromCopy(copy, cutter.code.toLowerCase())!
      // Everything the page shows but the last cuts, which the copy leaves out to stay small.
      for (const field of ['id', 'code', 'status', 'machine', 'regrindCount', 'diameterMm', 'lifeUsed', 'lifeScale', 'minutesTotal',
        'minutesThisLife', 'flagged', 'lifeThreshold', 'due', 'remainingMinutes'] as const) {
        expect(kept[field], `${cutter.code} ${field}`).toEqual(page[field])
      }
      for (const field of Object.keys(kept.type) as Array<keyof typeof kept.type>) expect(kept.type[field]).toEqual(page.type[field])
    }
    expect(cutterFromCopy(copy, first!.code)!.machine).toEqual({ id: fx.machines.changer, name: 'Big table with changer' })
  })

  it('holds the person\'s own shop only', async () => {
    const copy = (await other.operator.get('/api/offline/copy')).body as OfflineCopy
    expect(copy.cutters.map((c) => c[1]).sort()).toEqual(otherFx.cutters.map((c) => c.code).sort())
    for (const c of fx.cutters) expect(cutterFromCopy(copy, c.code)).toBeNull()
  })
})

describe('loads and returns from the phone\'s queue carry a key', () => {
  it('a load sent again with its key after the cutter was returned is not done twice', async () => {
    const cutter = fx.cutters[2]!
    const loadKey = key()
    const load = { machineId: fx.machines.other, idempotencyKey: loadKey }
    expect((await shop.operator.post(`/api/cutters/${cutter.id}/load`, load)).status).toBe(200)
    const returned = await shop.operator.post(`/api/cutters/${cutter.id}/return`, { idempotencyKey: key() })
    expect(returned.body.cutter.status).toBe('in_crib')

    // The phone never heard the load's answer and sends it again, with the same key.
    const again = await shop.operator.post(`/api/cutters/${cutter.id}/load`, load)
    expect(again.status).toBe(200)
    expect(again.body.cutter.status).toBe('in_crib')
    expect((await eventsOf(cutter.id)).map((e) => e.kind)).toEqual(['loaded', 'returned'])
    expect((await eventsOf(cutter.id))[0]!.idempotency_key).toBe(loadKey)
  })

  it('a return sent again with its key after the cutter was loaded again is not done twice', async () => {
    const cutter = fx.cutters[1]!
    const returnKey = key()
    expect((await shop.operator.post(`/api/cutters/${cutter.id}/load`, { machineId: fx.machines.single })).status).toBe(200)
    expect((await shop.operator.post(`/api/cutters/${cutter.id}/return`, { idempotencyKey: returnKey })).status).toBe(200)
    expect((await shop.operator.post(`/api/cutters/${cutter.id}/load`, { machineId: fx.machines.single, idempotencyKey: key() })).status).toBe(200)
    const again = await shop.operator.post(`/api/cutters/${cutter.id}/return`, { idempotencyKey: returnKey })
    expect(again.status).toBe(200)
    expect(again.body.cutter.status).toBe('in_spindle')
    expect((await eventsOf(cutter.id)).map((e) => e.kind)).toEqual(['loaded', 'returned', 'loaded'])
  })

  it('a return with no body at all still works, as before', async () => {
    const cutter = fx.cutters[1]!
    const res = await shop.operator.send('POST', `/api/cutters/${cutter.id}/return`)
    expect(res.status).toBe(200)
    expect(res.body.cutter.status).toBe('in_crib')
  })

  it('a key shorter than 8 characters is refused with the field named', async () => {
    const res = await shop.operator.post(`/api/cutters/${fx.cutters[1]!.id}/load`, { machineId: fx.machines.single, idempotencyKey: 'short' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.idempotencyKey).toMatch(/8 to 100/)
  })
})
