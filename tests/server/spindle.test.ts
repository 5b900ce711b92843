// At the spindle: looking a cutter up by its label, loading, logging cuts, returning and
// flagging, with every minute counted once in the cutter's wear.
import { randomUUID } from 'node:crypto'
import { sql } from 'kysely'
import { PNG } from 'pngjs'
import { beforeAll, describe, expect, it } from 'vitest'
import { withLoggedCut } from '../../shared/kerf/cut-answer'
import { appDb } from '../support/db'
import { Client } from '../support/http'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, loadCutters, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let other: TestShop
let fx: SpindleFixture
let otherFx: SpindleFixture
let material: Record<string, { id: number, wearFactor: number }>

const key = () => `test-${randomUUID()}`
const cut = (client: Client, cutterId: number, body: Record<string, unknown>) =>
  client.post(`/api/cutters/${cutterId}/cuts`, { idempotencyKey: key(), outcome: 'clean', ...body })

async function dbRow(cutterId: number) {
  const db = appDb()
  try {
    const cutter = await db.selectFrom('cutters').selectAll().where('id', '=', cutterId).executeTakeFirstOrThrow()
    const logs = await db.selectFrom('cut_logs').select(['id', 'minutes']).where('cutter_id', '=', cutterId).execute()
    const events = await db.selectFrom('cutter_events').select(['kind']).where('cutter_id', '=', cutterId).execute()
    return { cutter, logs, events }
  } finally {
    await db.destroy()
  }
}

function tinyPng(): Buffer {
  const png = new PNG({ width: 2, height: 2 })
  png.data.fill(200)
  return PNG.sync.write(png)
}

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Spindle'), makeShop('Elsewhere')])
  ;[fx, otherFx] = await Promise.all([addSpindleFixture(shop.id, 13), addSpindleFixture(other.id, 1)])
  const list = (await shop.operator.get('/api/materials')).body as Array<{ id: number, name: string, wearFactor: number }>
  material = Object.fromEntries(list.map((m) => [m.name, m]))
  // A cut is logged only on a loaded cutter: these are in the big table when the tests begin.
  await loadCutters(shop.operator, [2, 3, 4, 12].map((i) => fx.cutters[i]!.id), fx.machines.changer)
})

describe('looking a cutter up by its label code', () => {
  it('answers the cutter with its type, life and remaining minutes in every material', async () => {
    const c = fx.cutters[0]!
    const res = await shop.operator.get(`/api/cutters/by-code/${c.code.toLowerCase()}`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({
      id: c.id, code: c.code, status: 'in_crib', machine: null, regrindCount: 0, diameterMm: 6.35, lifeUsed: 0, minutesTotal: 0,
      type: { ratedLifeMinutes: 600, flutes: 2, cuttingDiameterMm: 6.35, helix: 'upcut', profile: 'square_end' },
    })
    const hdpe = res.body.remainingMinutes.find((r: { materialId: number }) => r.materialId === material.HDPE!.id)
    expect(hdpe.minutes).toBeCloseTo(600 / material.HDPE!.wearFactor, 1)
  })

  it('says plainly when no cutter has that code in the shop', async () => {
    const res = await shop.operator.get('/api/cutters/by-code/ZZZZ999')
    expect(res.status).toBe(404)
    expect(res.body.message).toBe('No cutter has the label code ZZZZ999 in your shop.')
    expect((await shop.operator.get(`/api/cutters/by-code/${otherFx.cutters[0]!.code}`)).status).toBe(404)
  })
})

describe('life used through the route (Palmgren–Miner linear damage rule)', () => {
  it('adds minutes × wear factor / rated life for each cut, across materials', async () => {
    const c = fx.cutters[1]!
    expect((await shop.operator.post(`/api/cutters/${c.id}/load`, { machineId: fx.machines.changer })).status).toBe(200)
    const mdf = material.MDF!
    const acp = material['Aluminium composite panel']!
    // By hand: 120 min of MDF and 90 min of composite on a 600-minute type.
    const expected = (120 * mdf.wearFactor) / 600 + (90 * acp.wearFactor) / 600
    const first = await cut(shop.operator, c.id, { materialId: mdf.id, minutes: 120 })
    expect(first.status).toBe(201)
    expect(first.body.lifeUsed).toBeCloseTo((120 * mdf.wearFactor) / 600, 6)
    const before = (await shop.operator.get(`/api/cutters/${c.id}`)).body
    const second = await cut(shop.operator, c.id, { materialId: acp.id, minutes: 90, rpm: 18000, feedMmPerMin: 2500, note: 'sign faces' })
    expect(second.body.lifeUsed).toBeCloseTo(expected, 6)
    expect(second.body.minutesTotal).toBe(210)

    const view = (await shop.operator.get(`/api/cutters/${c.id}`)).body
    expect(view.lifeUsed).toBeCloseTo(expected, 6)
    // The cut's answer carries what changed, and the page's view with it put in is the view a
    // fresh read gives, so the phone need not fetch again.
    expect(second.body.cutter.remainingMinutes).toBeUndefined()
    expect(withLoggedCut(before, second.body.cutter)).toEqual(view)
    const remainingMdf = view.remainingMinutes.find((r: { materialId: number }) => r.materialId === mdf.id).minutes
    expect(remainingMdf).toBeCloseTo(((1 - expected) * 600) / mdf.wearFactor, 1)
    expect(view.recentCuts[0]).toMatchObject({ minutes: 90, materialName: 'Aluminium composite panel', rpm: 18000, note: 'sign faces', operatorName: 'Test Operator' })

    // A log that waited on a phone (an hour old, so not the newest) and names another machine:
    // the answer's recent cuts are in the order and with the names a fresh read gives.
    const late = await cut(shop.operator, c.id, { materialId: mdf.id, minutes: 15, machineId: fx.machines.other, cutAt: new Date(Date.now() - 3_600_000).toISOString() })
    expect(late.status).toBe(201)
    const shown = withLoggedCut(view, late.body.cutter)
    expect(shown).toEqual((await shop.operator.get(`/api/cutters/${c.id}`)).body)
    expect(shown.recentCuts.map((r: { minutes: number }) => r.minutes)).toEqual([90, 120, 15])
    // The same answer again (a log sent twice) leaves the page as it was.
    expect(withLoggedCut(shown, late.body.cutter)).toEqual(shown)
    // A replay of the key answers the cutter as it is now, which puts in the same way.
    const again = await shop.operator.post(`/api/cutters/${c.id}/cuts`, { idempotencyKey: late.body.log.idempotencyKey, materialId: mdf.id, minutes: 15, outcome: 'clean' })
    expect(again.status).toBe(200)
    expect(withLoggedCut(view, again.body.cutter)).toEqual(shown)

    const { events } = await dbRow(c.id)
    expect(events.filter((e) => e.kind === 'cut_logged')).toHaveLength(3)
  })
})

describe('idempotency', () => {
  it('the same key sent 20 times at once gives one log and counts once', async () => {
    const c = fx.cutters[2]!
    const body = { idempotencyKey: key(), materialId: material.MDF!.id, minutes: 30, outcome: 'clean' }
    const answers = await Promise.all(Array.from({ length: 20 }, () => shop.operator.post(`/api/cutters/${c.id}/cuts`, body)))
    expect(answers.filter((a) => a.status === 201)).toHaveLength(1)
    expect(answers.filter((a) => a.status === 200)).toHaveLength(19)
    expect(new Set(answers.map((a) => a.body.log.id)).size).toBe(1)
    const { cutter, logs } = await dbRow(c.id)
    expect(logs).toHaveLength(1)
    expect(cutter.minutes_total).toBe(30)
    expect(cutter.life_used).toBeCloseTo((30 * material.MDF!.wearFactor) / 600, 6)
  })

  it('a key already used for another cutter is refused', async () => {
    const body = { idempotencyKey: key(), materialId: material.MDF!.id, minutes: 5, outcome: 'clean' }
    expect((await shop.operator.post(`/api/cutters/${fx.cutters[3]!.id}/cuts`, body)).status).toBe(201)
    expect((await shop.operator.post(`/api/cutters/${fx.cutters[4]!.id}/cuts`, body)).status).toBe(409)
  })
})

describe('a cut logged while the cutter changes', () => {
  it('is written for the cutter as it is then: the route reads again when its read went stale', async () => {
    // The route reads the cutter without a lock and writes only if it is still as read. Here the
    // test holds the cutter's row while eight logs arrive (each has read it and waits to write),
    // retires the cutter and lets go: every log must notice, read again and log against a retired
    // cutter, each counted once.
    const c = fx.cutters[12]!
    const minutes = [5, 6, 7, 8, 9, 10, 11, 12]
    const db = appDb()
    try {
      let answers: Promise<Array<{ status: number }>> | undefined
      await db.transaction().execute(async (tx) => {
        await tx.selectFrom('cutters').select('id').where('id', '=', c.id).forUpdate().execute()
        const holder = (await sql<{ pid: number }>`select pg_backend_pid() as pid`.execute(tx)).rows[0]!.pid
        answers = Promise.all(minutes.map((m) => cut(shop.operator, c.id, { materialId: material.MDF!.id, minutes: m })))
        // Every log has read the cutter and waits, behind this transaction's lock, to write.
        await expect.poll(async () => Number((await sql<{ n: string }>`
          with recursive waiting(pid) as (
            select ${holder}::int
            union select a.pid from pg_stat_activity a join waiting w on w.pid = any(pg_blocking_pids(a.pid)))
          select count(*) - 1 as n from waiting`.execute(db)).rows[0]!.n),
        { timeout: 10_000 }).toBe(minutes.length)
        await tx.updateTable('cutters').set({ status: 'retired', retired_reason: 'worn', machine_id: null }).where('id', '=', c.id).execute()
      })
      expect((await answers!).map((a) => a.status)).toEqual(minutes.map(() => 201))
      const cutter = await db.selectFrom('cutters').select(['status', 'minutes_total', 'life_used']).where('id', '=', c.id).executeTakeFirstOrThrow()
      const logs = await db.selectFrom('cut_logs').select(['minutes', 'life_added']).where('cutter_id', '=', c.id).execute()
      const events = await db.selectFrom('cutter_events').select(['kind', 'from_status', 'to_status']).where('cutter_id', '=', c.id)
        .where('kind', '<>', 'loaded').execute()
      expect(cutter.status).toBe('retired')
      expect(logs.map((l) => l.minutes).sort((x, y) => x - y)).toEqual(minutes)
      expect(cutter.minutes_total).toBe(minutes.reduce((x, y) => x + y, 0))
      expect(cutter.life_used).toBeCloseTo(logs.reduce((x, l) => x + l.life_added, 0), 6)
      expect(events).toEqual(minutes.map(() => ({ kind: 'cut_logged', from_status: 'retired', to_status: 'retired' })))
    } finally {
      await db.destroy()
    }
  })
})

describe('loading', () => {
  it('two operators loading one cutter at once: one 200, one 409 naming the machine', async () => {
    const c = fx.cutters[5]!
    const second = new Client()
    await second.login(shop.emails.crib, 'correct-horse-battery')
    const [a, b] = await Promise.all([
      shop.operator.post(`/api/cutters/${c.id}/load`, { machineId: fx.machines.changer }),
      second.post(`/api/cutters/${c.id}/load`, { machineId: fx.machines.other }),
    ])
    expect([a.status, b.status].sort()).toEqual([200, 409])
    const loser = a.status === 409 ? a : b
    const winner = a.status === 200 ? a : b
    expect(loser.body.message).toContain(`already loaded in ${winner.body.cutter.machine.name}`)
    const { events } = await dbRow(c.id)
    expect(events.filter((e) => e.kind === 'loaded')).toHaveLength(1)
  })

  it('loading into a machine without a tool changer that holds a bit is refused (machines.test.ts has the rest)', async () => {
    const [first, second] = [fx.cutters[6]!, fx.cutters[7]!]
    expect((await shop.operator.post(`/api/cutters/${first.id}/load`, { machineId: fx.machines.single })).status).toBe(200)
    const res = await shop.operator.post(`/api/cutters/${second.id}/load`, { machineId: fx.machines.single })
    expect(res.status).toBe(409)
    expect((await dbRow(first.id)).cutter).toMatchObject({ status: 'in_spindle', machine_id: fx.machines.single })
  })

  it('an unknown machine is a 400 naming the field', async () => {
    const res = await shop.operator.post(`/api/cutters/${fx.cutters[8]!.id}/load`, { machineId: otherFx.machines.changer })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.machineId).toMatch(/no such machine/)
  })
})

describe('bad input answers 400 and writes nothing', () => {
  const cases: Array<[string, Record<string, unknown>, string]> = [
    ['zero minutes', { minutes: 0 }, 'minutes'],
    ['negative minutes', { minutes: -3 }, 'minutes'],
    ['more than 24 hours', { minutes: 1441 }, 'minutes'],
    ['minutes as text', { minutes: 'ten' }, 'minutes'],
    ['an unknown outcome', { outcome: 'smoked' }, 'outcome'],
    ['a short key', { idempotencyKey: 'abc' }, 'idempotencyKey'],
    ['a time in the future', { cutAt: new Date(Date.now() + 86_400_000).toISOString() }, 'cutAt'],
  ]
  it.each(cases)('%s', async (_label, change, field) => {
    const c = fx.cutters[9]!
    const res = await shop.operator.post(`/api/cutters/${c.id}/cuts`, { idempotencyKey: key(), materialId: material.MDF!.id, minutes: 10, outcome: 'clean', ...change })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields)).toContain(field)
    expect(res.body.message).toContain(field)
    const { cutter, logs } = await dbRow(c.id)
    expect(logs).toHaveLength(0)
    expect(cutter.life_used).toBe(0)
  })

  it('another shop\'s material', async () => {
    const c = fx.cutters[9]!
    const theirs = (await other.operator.get('/api/materials')).body[0].id
    const res = await cut(shop.operator, c.id, { materialId: theirs, minutes: 10 })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.materialId).toMatch(/no such material/)
    expect((await dbRow(c.id)).logs).toHaveLength(0)
  })
})

describe('returning and flagging', () => {
  it('returns a loaded cutter to the crib', async () => {
    const c = fx.cutters[10]!
    await shop.operator.post(`/api/cutters/${c.id}/load`, { machineId: fx.machines.changer })
    const res = await shop.operator.post(`/api/cutters/${c.id}/return`)
    expect(res.status).toBe(200)
    expect(res.body.cutter).toMatchObject({ status: 'in_crib', machine: null })
  })

  it('flags dull with a photo: out of the spindle, due, and the photo served to the shop only', async () => {
    const c = fx.cutters[1]!
    const form = new FormData()
    form.set('kind', 'dull')
    form.set('note', 'fuzzy edges on HDPE')
    form.set('photo', new Blob([new Uint8Array(tinyPng())], { type: 'image/png' }), 'edge.png')
    const res = await shop.operator.post(`/api/cutters/${c.id}/flag`, form)
    expect(res.status).toBe(200)
    expect(res.body.cutter).toMatchObject({ status: 'in_crib', machine: null, flagged: 'dull', due: { reason: 'flagged_dull', action: 'resharpen' } })

    const db = appDb()
    const event = await db.selectFrom('cutter_events').select(['photo_id', 'note']).where('cutter_id', '=', c.id).where('kind', '=', 'flagged_dull').executeTakeFirstOrThrow()
    await db.destroy()
    expect(event.note).toBe('fuzzy edges on HDPE')
    const photo = await fetch(`${process.env.KERFBOOK_TEST_URL}/api/uploads/${event.photo_id}`, { headers: { cookie: '' } })
    expect(photo.status).toBe(401)
    const own = await shop.crib.request('GET', `/api/uploads/${event.photo_id}`)
    expect(own.status).toBe(200)
    expect(own.headers.get('content-type')).toBe('image/png')
    expect((await other.owner.get(`/api/uploads/${event.photo_id}`)).status).toBe(404)
  })

  it('refuses a photo that is not an image, whatever its name, an empty one and an oversize one', async () => {
    const c = fx.cutters[11]!
    const send = (data: Uint8Array<ArrayBuffer>, name: string, type: string) => {
      const form = new FormData()
      form.set('kind', 'dull')
      form.set('photo', new Blob([data], { type }), name)
      return shop.operator.post(`/api/cutters/${c.id}/flag`, form)
    }
    const disguised = await send(new TextEncoder().encode('#!/bin/sh\necho not a photo\n'), 'bit.jpg', 'image/jpeg')
    expect(disguised.status).toBe(415)
    expect(disguised.body.message).toMatch(/not a JPEG, PNG, WebP or HEIC image/)
    expect((await send(new Uint8Array(0), 'empty.jpg', 'image/jpeg')).status).toBe(400)
    const big = new Uint8Array(9 * 1024 * 1024)
    big.set([0xFF, 0xD8, 0xFF])
    const oversize = await send(big, 'big.jpg', 'image/jpeg')
    expect(oversize.status).toBe(413)
    expect(oversize.body.message).toMatch(/at most 8 MB/)
    const { cutter, events } = await dbRow(c.id)
    expect(cutter.flagged).toBeNull()
    expect(events).toHaveLength(0)
  })

  it('flagging broken retires the cutter, and a retired cutter cannot be loaded', async () => {
    const c = fx.cutters[11]!
    const res = await shop.operator.post(`/api/cutters/${c.id}/flag`, { kind: 'broken' })
    expect(res.body.cutter).toMatchObject({ status: 'retired', flagged: 'broken', retiredReason: 'broken' })
    const load = await shop.operator.post(`/api/cutters/${c.id}/load`, { machineId: fx.machines.changer })
    expect(load.status).toBe(409)
    expect(load.body.message).toMatch(/is retired/)
  })

  it('a cut logged as broken retires the cutter too', async () => {
    const c = fx.cutters[3]!
    await shop.operator.post(`/api/cutters/${c.id}/load`, { machineId: fx.machines.changer })
    const before = (await shop.operator.get(`/api/cutters/${c.id}`)).body
    const res = await cut(shop.operator, c.id, { materialId: material.HDPE!.id, minutes: 4, outcome: 'broken' })
    expect(res.body.status).toBe('retired')
    expect(withLoggedCut(before, res.body.cutter)).toEqual((await shop.operator.get(`/api/cutters/${c.id}`)).body)
    const { events } = await dbRow(c.id)
    expect(events.map((e) => e.kind)).toEqual(expect.arrayContaining(['cut_logged', 'flagged_broken']))
    expect((await dbRow(c.id)).cutter).toMatchObject({ retired_reason: 'broken', machine_id: null })
  })
})

describe('another shop', () => {
  it('gets 404 for every spindle route of this shop\'s cutter', async () => {
    const c = fx.cutters[0]!
    const op = other.operator
    expect((await op.get(`/api/cutters/${c.id}`)).status).toBe(404)
    expect((await op.post(`/api/cutters/${c.id}/load`, { machineId: otherFx.machines.changer })).status).toBe(404)
    expect((await op.post(`/api/cutters/${c.id}/return`)).status).toBe(404)
    expect((await op.post(`/api/cutters/${c.id}/flag`, { kind: 'dull' })).status).toBe(404)
    const theirMaterial = (await op.get('/api/materials')).body[0].id
    expect((await cut(op, c.id, { materialId: theirMaterial, minutes: 5 })).status).toBe(404)
    const { cutter, logs } = await dbRow(c.id)
    expect(cutter.status).toBe('in_crib')
    expect(logs).toHaveLength(0)
  })
})
