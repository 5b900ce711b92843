// The crib's inventory list: paged, filtered and sorted by the server, for crib managers of the
// shop only. The row actions and the history are in inventory-actions.test.ts.
import { beforeAll, describe, expect, it } from 'vitest'
import { newLabelCode } from '../../shared/kerf/label-code'
import { appDb } from '../support/db'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

interface Row { id: number, code: string, status: string, typeId: number, typeName: string, machineId: number | null, machineName: string | null, lifeUsed: number, flagged: string | null, due: { reason: string, action: string } | null }

let shop: TestShop
let other: TestShop
let fx: SpindleFixture
let otherFx: SpindleFixture
let oflute: number
// What was written, to check the answers against.
let written: Array<{ id: number, code: string, status: string, typeId: number, machineId: number | null, lifeUsed: number, flagged: 'dull' | null }>

const STATUSES = ['in_crib', 'in_crib', 'in_spindle', 'at_regrind', 'retired', 'lost'] as const
const COUNT = 90
const TOTAL = COUNT + 1
const list = (query = '', client = shop.crib) => client.get(`/api/cutters${query ? `?${query}` : ''}`)
const all = async (query: string) => (await list(`${query}&pageSize=200`)).body.rows as Row[]

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Inventory'), makeShop('Neighbour')])
  ;[fx, otherFx] = await Promise.all([addSpindleFixture(shop.id, 1), addSpindleFixture(other.id, 4)])
  const db = appDb()
  try {
    oflute = (await db.insertInto('cutter_types').values({
      shop_id: shop.id, name: 'O-flute 1/8" acrylic', profile: 'o_flute', helix: 'upcut', flutes: 1, cutting_diameter_mm: 3.175,
      shank_diameter_mm: 6.35, cutting_length_mm: 12, overall_length_mm: 50, rated_life_minutes: 300, min_usable_diameter_mm: 3,
      unit_cost_cents: 2500, max_regrinds: 1,
    }).returning('id').executeTakeFirstOrThrow()).id
    const machines = [fx.machines.changer, fx.machines.other]
    const rows = Array.from({ length: COUNT }, (_, i) => {
      const status = STATUSES[i % STATUSES.length]!
      return {
        shop_id: shop.id, type_id: i % 3 === 0 ? oflute : fx.typeId, code: newLabelCode(), status, diameter_mm: i % 3 === 0 ? 3.175 : 6.35,
        machine_id: status === 'in_spindle' ? machines[Math.floor(i / STATUSES.length) % 2]! : null, retired_reason: status === 'retired' ? 'worn' as const : null,
        life_used: Math.round(((i * 37) % COUNT) / COUNT * 1.2 * 1e6) / 1e6, minutes_total: (i * 13) % 400, regrind_count: i % 2,
        flagged: i % 10 === 1 && status === 'in_crib' ? 'dull' as const : null,
      }
    })
    const back = await db.insertInto('cutters').values(rows).returning(['id', 'code', 'status', 'type_id', 'machine_id', 'life_used', 'flagged']).execute()
    written = back.map((r) => ({ id: r.id, code: r.code, status: r.status, typeId: r.type_id, machineId: r.machine_id, lifeUsed: r.life_used, flagged: r.flagged as 'dull' | null }))
    // The fixture's own cutter: new, in the crib.
    written.push({ ...fx.cutters[0]!, status: 'in_crib', typeId: fx.typeId, machineId: null, lifeUsed: 0, flagged: null })
  } finally {
    await db.destroy()
  }
})

describe('paging', () => {
  it('answers 50 rows and the total by default', async () => {
    const res = await list()
    expect(res.status).toBe(200)
    expect(res.body.total).toBe(TOTAL)
    expect(res.body.rows).toHaveLength(50)
    expect(res.body.rows[0]).toMatchObject({
      id: expect.any(Number), code: expect.any(String), status: expect.any(String), typeId: expect.any(Number), typeName: expect.any(String),
      lifeUsed: expect.any(Number), minutesTotal: expect.any(Number), regrindCount: expect.any(Number), diameterMm: expect.any(Number),
      updatedAt: expect.any(String),
    })
  })

  it('walks every cutter once across pages, with a short last page and an empty one after it', async () => {
    const seen: number[] = []
    for (let page = 1; page <= 4; page++) {
      const res = await list(`pageSize=25&page=${page}&sort=-lifeUsed`)
      expect(res.body.total).toBe(TOTAL)
      expect(res.body.rows).toHaveLength(page < 4 ? 25 : TOTAL - 75)
      seen.push(...res.body.rows.map((r: Row) => r.id))
    }
    expect(new Set(seen).size).toBe(TOTAL)
    expect(seen.sort((a, b) => a - b)).toEqual(written.map((w) => w.id).sort((a, b) => a - b))
    const beyond = await list('pageSize=25&page=5')
    expect(beyond.body).toMatchObject({ total: TOTAL, rows: [] })
  })
})

describe('filters', () => {
  it('one status, or several', async () => {
    const lost = await list('status=lost')
    expect(lost.body.total).toBe(written.filter((w) => w.status === 'lost').length)
    expect(lost.body.rows.every((r: Row) => r.status === 'lost')).toBe(true)
    const inUse = await all('status=in_crib,in_spindle')
    expect(inUse).toHaveLength(written.filter((w) => w.status === 'in_crib' || w.status === 'in_spindle').length)
    expect(new Set(inUse.map((r) => r.status))).toEqual(new Set(['in_crib', 'in_spindle']))
  })

  it('cutter type and machine', async () => {
    const byType = await all(`typeId=${oflute}`)
    expect(byType).toHaveLength(written.filter((w) => w.typeId === oflute).length)
    expect(byType.every((r) => r.typeName === 'O-flute 1/8" acrylic')).toBe(true)
    const inMachine = await all(`machineId=${fx.machines.other}`)
    expect(inMachine.length).toBeGreaterThan(0)
    expect(inMachine).toHaveLength(written.filter((w) => w.machineId === fx.machines.other).length)
    expect(inMachine.every((r) => r.machineName === 'Second big table' && r.status === 'in_spindle')).toBe(true)
  })

  it('life used as a fraction, from lifeMin up to but not including lifeMax', async () => {
    const band = await all('lifeMin=0.5&lifeMax=0.9')
    expect(band).toHaveLength(written.filter((w) => w.lifeUsed >= 0.5 && w.lifeUsed < 0.9).length)
    expect(band.every((r) => r.lifeUsed >= 0.5 && r.lifeUsed < 0.9)).toBe(true)
    const worn = await all('lifeMin=0.9')
    expect(worn).toHaveLength(written.filter((w) => w.lifeUsed >= 0.9).length)
  })

  it('q finds a label code by its start in any case, and a type by part of its name', async () => {
    const target = written[7]!
    const prefix = target.code.slice(0, 4)
    const byCode = await all(`q=${prefix.toLowerCase()}`)
    expect(byCode.map((r) => r.id)).toContain(target.id)
    expect(byCode.every((r) => r.code.startsWith(prefix) || r.typeName.toLowerCase().includes(prefix.toLowerCase()))).toBe(true)
    const byName = await all('q=ACRYLIC')
    expect(byName).toHaveLength(written.filter((w) => w.typeId === oflute).length)
    expect((await list('q=%25')).body.total).toBe(0)
  })

  it('due keeps cutters flagged dull or past the threshold, in the crib or a spindle', async () => {
    const isDue = (w: typeof written[number]) => ['in_crib', 'in_spindle'].includes(w.status) && (w.flagged === 'dull' || w.lifeUsed >= 0.9)
    const due = await all('due=true&sort=-lifeUsed')
    expect(due).toHaveLength(written.filter(isDue).length)
    expect(due.every((r) => r.due && ['life_used', 'flagged_dull'].includes(r.due.reason))).toBe(true)
    expect(due.some((r) => r.due?.reason === 'flagged_dull' && r.lifeUsed < 0.9)).toBe(true)
    const notDue = await all('due=false')
    expect(notDue).toHaveLength(TOTAL - due.length)
    expect(notDue.every((r) => r.due === null)).toBe(true)
  })
})

describe('sorting', () => {
  const sortedBy = <T>(values: T[], cmp: (a: T, b: T) => number) => [...values].sort(cmp)

  it('by life used, both ways', async () => {
    const up = (await all('sort=lifeUsed')).map((r) => r.lifeUsed)
    const down = (await all('sort=-lifeUsed')).map((r) => r.lifeUsed)
    expect(up).toEqual(sortedBy(up, (a, b) => a - b))
    expect(down).toEqual(sortedBy(up, (a, b) => b - a))
    expect(up[0]).toBe(Math.min(...written.map((w) => w.lifeUsed)))
  })

  it('by label code, both ways', async () => {
    const codes = written.map((w) => w.code).sort()
    expect((await all('sort=code')).map((r) => r.code)).toEqual(codes)
    expect((await all('sort=-code')).map((r) => r.code)).toEqual([...codes].reverse())
  })

  it('by machine, with cutters in no machine last either way', async () => {
    for (const sort of ['machine', '-machine']) {
      const rows = await all(`sort=${sort}`)
      const firstWithout = rows.findIndex((r) => r.machineName === null)
      expect(firstWithout).toBeGreaterThan(0)
      expect(rows.slice(firstWithout).every((r) => r.machineName === null)).toBe(true)
    }
  })
})

describe('bad queries answer 400 naming the field', () => {
  it.each([
    ['sort=colour', 'sort'],
    ['pageSize=201', 'pageSize'],
    ['page=0', 'page'],
    ['status=borrowed', 'status'],
    ['lifeMin=0.9&lifeMax=0.5', 'lifeMax'],
    ['due=maybe', 'due'],
    ['typeId=abc', 'typeId'],
  ])('%s', async (query, field) => {
    const res = await list(query)
    expect(res.status).toBe(400)
    expect(res.body.message).toContain(field)
    expect(Object.keys(res.body.data.fields)).toContain(field)
  })
})

describe('who may see it', () => {
  // The 401 and 403 themselves are the route table's (routes.test.ts).
  it('operators are told the role it needs; owners see it', async () => {
    const op = await list('', shop.operator)
    expect(op.body.message).toMatch(/needs the crib manager role/)
    expect((await list('', shop.owner)).body.total).toBe(TOTAL)
  })

  it('another shop\'s cutters never appear, whatever the filter', async () => {
    const theirs = new Set(otherFx.cutters.map((c) => c.id))
    const mine = await all('')
    expect(mine.some((r) => theirs.has(r.id))).toBe(false)
    expect((await list(`q=${otherFx.cutters[0]!.code}`)).body.total).toBe(0)
    expect((await list(`typeId=${otherFx.typeId}`)).body.total).toBe(0)
    expect((await list(`machineId=${otherFx.machines.changer}`)).body.total).toBe(0)
    expect((await list('', other.crib)).body.total).toBe(4)
  })
})
