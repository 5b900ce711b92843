// The shop's machines: adding, changing, retiring and bringing back, with names unique in any
// case; and the one-bit rule of a machine without a tool changer, also when two loads race.
import { beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let other: TestShop
let fx: SpindleFixture
let otherFx: SpindleFixture

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Machines'), makeShop('Machines elsewhere')])
  ;[fx, otherFx] = await Promise.all([addSpindleFixture(shop.id, 12), addSpindleFixture(other.id, 1)])
})

const router = (over: Record<string, unknown> = {}) => ({ name: `Router ${Math.random().toString(36).slice(2, 8)}`, minRpm: 6000, maxRpm: 24000, pockets: 8, ...over })

async function inMachine(machineId: number) {
  const db = appDb()
  try {
    return await db.selectFrom('cutters').select(['id', 'code']).where('machine_id', '=', machineId).where('status', '=', 'in_spindle').execute()
  } finally {
    await db.destroy()
  }
}

describe('adding a machine', () => {
  it('a crib manager adds one with every field and it is in the operators\' list', async () => {
    const res = await shop.crib.post('/api/machines', router({ name: 'Gantry 5x10', description: 'Vacuum table', spindlePowerKw: 9, bedXMm: 3050, bedYMm: 1525 }))
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: 'Gantry 5x10', pockets: 8, spindlePowerKw: 9, bedXMm: 3050, bedYMm: 1525, active: true, retiredAt: null, loaded: [] })
    const list = await shop.operator.get('/api/machines')
    expect(list.body.map((m: { name: string }) => m.name)).toContain('Gantry 5x10')
  })

  it('a name already used in any case answers 409 naming the field', async () => {
    const res = await shop.owner.post('/api/machines', router({ name: 'GANTRY 5X10' }))
    expect(res.status).toBe(409)
    expect(res.body.data.fields.name).toMatch(/already has this name/)
    // Another shop may use it.
    expect((await other.owner.post('/api/machines', router({ name: 'Gantry 5x10' }))).status).toBe(201)
  })

  it.each([
    ['lowest speed not below the highest', { minRpm: 24000, maxRpm: 24000 }, 'maxRpm'],
    ['a speed under 1,000 rpm', { minRpm: 500 }, 'minRpm'],
    ['a speed over 100,000 rpm', { maxRpm: 100_001 }, 'maxRpm'],
    ['100 pockets', { pockets: 100 }, 'pockets'],
    ['negative pockets', { pockets: -1 }, 'pockets'],
    ['half a pocket', { pockets: 2.5 }, 'pockets'],
    ['no power', { spindlePowerKw: 0 }, 'spindlePowerKw'],
    ['an empty name', { name: '  ' }, 'name'],
  ])('%s answers 400 naming the field and adds nothing', async (_label, change, field) => {
    const before = (await shop.crib.get('/api/machines?retired=include')).body.length
    const res = await shop.crib.post('/api/machines', router(change))
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields)).toContain(field)
    expect((await shop.crib.get('/api/machines?retired=include')).body.length).toBe(before)
  })
})

describe('changing a machine', () => {
  it('changes the fields sent and keeps the rest; speeds are checked on the row as it will be', async () => {
    const made = (await shop.crib.post('/api/machines', router({ name: 'Desk router', minRpm: 10000, maxRpm: 30000, pockets: 0 }))).body
    const res = await shop.crib.patch(`/api/machines/${made.id}`, { description: 'By the window', spindlePowerKw: 1.5 })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ name: 'Desk router', description: 'By the window', minRpm: 10000, maxRpm: 30000, pockets: 0, spindlePowerKw: 1.5 })
    const bad = await shop.crib.patch(`/api/machines/${made.id}`, { minRpm: 30000 })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.maxRpm).toMatch(/higher than the lowest/)
    expect((await shop.crib.get(`/api/machines/${made.id}`)).body.minRpm).toBe(10000)
  })

  it('fewer pockets than the cutters it holds answers 409 naming them', async () => {
    const made = (await shop.crib.post('/api/machines', router({ pockets: 2 }))).body
    const [a, b] = [fx.cutters[0]!, fx.cutters[1]!]
    expect((await shop.operator.post(`/api/cutters/${a.id}/load`, { machineId: made.id })).status).toBe(200)
    expect((await shop.operator.post(`/api/cutters/${b.id}/load`, { machineId: made.id })).status).toBe(200)
    const res = await shop.crib.patch(`/api/machines/${made.id}`, { pockets: 0 })
    expect(res.status).toBe(409)
    expect(res.body.data.fields.pockets).toContain(a.code)
    expect(res.body.data.fields.pockets).toContain(b.code)
    expect((await shop.crib.get(`/api/machines/${made.id}`)).body.pockets).toBe(2)
    for (const c of [a, b]) await shop.operator.post(`/api/cutters/${c.id}/return`, {})
  })

  it('another shop\'s machine answers 404 and is not changed', async () => {
    const res = await shop.crib.patch(`/api/machines/${otherFx.machines.changer}`, { name: 'Taken over' })
    expect(res.status).toBe(404)
    expect((await other.operator.get(`/api/machines/${otherFx.machines.changer}`)).body.name).toBe('Big table with changer')
  })
})

describe('retiring and bringing back', () => {
  it('a machine holding bits answers 409 naming them; empty, it retires and leaves the pick list', async () => {
    const made = (await shop.crib.post('/api/machines', router())).body
    const c = fx.cutters[2]!
    await shop.operator.post(`/api/cutters/${c.id}/load`, { machineId: made.id })
    const refused = await shop.crib.post(`/api/machines/${made.id}/retire`)
    expect(refused.status).toBe(409)
    expect(refused.body.message).toContain(c.code)
    expect(refused.body.data.cutters).toEqual([c.code])

    await shop.operator.post(`/api/cutters/${c.id}/return`, {})
    const retired = await shop.crib.post(`/api/machines/${made.id}/retire`)
    expect(retired.status).toBe(200)
    expect(retired.body.active).toBe(false)
    expect(new Date(retired.body.retiredAt).getTime()).toBeGreaterThan(Date.now() - 60_000)
    expect((await shop.operator.get('/api/machines')).body.map((m: { id: number }) => m.id)).not.toContain(made.id)
    expect((await shop.crib.get('/api/machines?retired=include')).body.map((m: { id: number }) => m.id)).toContain(made.id)
    // Loading into it is refused with the field named.
    const load = await shop.operator.post(`/api/cutters/${c.id}/load`, { machineId: made.id })
    expect(load.status).toBe(400)
    expect(load.body.data.fields.machineId).toMatch(/retired/)

    const back = await shop.owner.post(`/api/machines/${made.id}/restore`)
    expect(back.body).toMatchObject({ active: true, retiredAt: null })
    expect((await shop.operator.get('/api/machines')).body.map((m: { id: number }) => m.id)).toContain(made.id)
  })
})

describe('a machine without a tool changer holds one bit', () => {
  it('loading a second bit answers 409 naming the one there and changes nothing', async () => {
    const [first, second] = [fx.cutters[3]!, fx.cutters[4]!]
    expect((await shop.operator.post(`/api/cutters/${first.id}/load`, { machineId: fx.machines.single })).status).toBe(200)
    const res = await shop.operator.post(`/api/cutters/${second.id}/load`, { machineId: fx.machines.single })
    expect(res.status).toBe(409)
    expect(res.body.message).toContain(first.code)
    expect(res.body.data.held).toEqual([{ id: first.id, code: first.code }])
    expect(await inMachine(fx.machines.single)).toEqual([{ id: first.id, code: first.code }])
  })

  it('"return that one and load this" swaps them in one step, and names the wrong bit if another is there', async () => {
    const [first, second, third] = [fx.cutters[3]!, fx.cutters[4]!, fx.cutters[5]!]
    const wrong = await shop.operator.post(`/api/cutters/${second.id}/load`, { machineId: fx.machines.single, returnCutterId: third.id })
    expect(wrong.status).toBe(409)
    expect(wrong.body.message).toContain(first.code)
    const res = await shop.operator.post(`/api/cutters/${second.id}/load`, { machineId: fx.machines.single, returnCutterId: first.id })
    expect(res.status).toBe(200)
    expect(res.body.cutter).toMatchObject({ status: 'in_spindle', machine: { id: fx.machines.single } })
    expect(await inMachine(fx.machines.single)).toEqual([{ id: second.id, code: second.code }])
    const history = (await shop.crib.get(`/api/cutters/${first.id}/history`)).body
    expect(JSON.stringify(history)).toContain(`Taken out when ${second.code} was loaded`)
    await shop.operator.post(`/api/cutters/${second.id}/return`, {})
  })

  it('two loads at once into the empty machine, many times, always end with one bit in it', async () => {
    const machine = (await shop.crib.post('/api/machines', router({ pockets: 0 }))).body
    const [a, b] = [fx.cutters[6]!, fx.cutters[7]!]
    for (let round = 0; round < 15; round++) {
      const answers = await Promise.all([
        shop.operator.post(`/api/cutters/${a.id}/load`, { machineId: machine.id }),
        shop.crib.post(`/api/cutters/${b.id}/load`, { machineId: machine.id }),
      ])
      expect(answers.map((r) => r.status).sort()).toEqual([200, 409])
      const held = await inMachine(machine.id)
      expect(held).toHaveLength(1)
      const winner = answers.find((r) => r.status === 200)!
      expect(held[0]!.id).toBe(winner.body.cutter.id)
      expect(answers.find((r) => r.status === 409)!.body.message).toContain(held[0]!.code)
      expect((await shop.operator.post(`/api/cutters/${held[0]!.id}/return`, {})).status).toBe(200)
    }
  })

  it('two swaps at once into an occupied machine end with one bit in it', async () => {
    const machine = (await shop.crib.post('/api/machines', router({ pockets: 0 }))).body
    const [inside, a, b] = [fx.cutters[8]!, fx.cutters[9]!, fx.cutters[10]!]
    await shop.operator.post(`/api/cutters/${inside.id}/load`, { machineId: machine.id })
    const answers = await Promise.all([
      shop.operator.post(`/api/cutters/${a.id}/load`, { machineId: machine.id, returnCutterId: inside.id }),
      shop.crib.post(`/api/cutters/${b.id}/load`, { machineId: machine.id, returnCutterId: inside.id }),
    ])
    expect(answers.map((r) => r.status).sort()).toEqual([200, 409])
    expect(await inMachine(machine.id)).toHaveLength(1)
  })

  it('a machine with a tool changer takes several bits', async () => {
    const [a, b] = [fx.cutters[11]!, fx.cutters[0]!]
    expect((await shop.operator.post(`/api/cutters/${a.id}/load`, { machineId: fx.machines.changer })).status).toBe(200)
    expect((await shop.operator.post(`/api/cutters/${b.id}/load`, { machineId: fx.machines.changer })).status).toBe(200)
    expect(await inMachine(fx.machines.changer)).toHaveLength(2)
  })
})
