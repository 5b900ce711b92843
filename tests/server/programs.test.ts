// NC programs: uploaded once and read once, listed per shop; bad files answered with a sentence
// and nothing kept; cutters loaded into pockets; the check before the job with its warnings;
// logging a run once per key through the same cut logging as a cut logged by hand.
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { beforeAll, describe, expect, it } from 'vitest'
import { readNcProgram } from '../../shared/kerf/nc/read'
import { appDb } from '../support/db'
import { makeShop, type TestShop } from '../support/shops'
import { newLabelCode } from '../../shared/kerf/label-code'

const fixtures = fileURLToPath(new URL('../fixtures/nc/', import.meta.url))
const METRIC = readFileSync(`${fixtures}metric-xy.ngc`)

let shop: TestShop
let other: TestShop
let acrylic: number
let mdf: number
let ids: { machine: number, manual: number, upcutType: number, downcutType: number }

function form(data: Buffer | string, filename = 'job.ngc', fields: Record<string, string> = {}) {
  const f = new FormData()
  for (const [k, v] of Object.entries(fields)) f.append(k, v)
  f.append('file', new Blob([typeof data === 'string' ? data : new Uint8Array(data)]), filename)
  return f
}

async function withDb<T>(fn: (db: ReturnType<typeof appDb>) => Promise<T>): Promise<T> {
  const db = appDb()
  try { return await fn(db) } finally { await db.destroy() }
}

const programCount = (shopId: number) => withDb(async (db) => Number((await db.selectFrom('nc_programs').select((eb) => eb.fn.countAll().as('n')).where('shop_id', '=', shopId).executeTakeFirstOrThrow()).n))

async function newCutter(typeId: number, over: Record<string, unknown> = {}) {
  return withDb((db) => db.insertInto('cutters').values({ shop_id: shop.id, type_id: typeId, code: newLabelCode(), diameter_mm: 6.35, ...over })
    .returning(['id', 'code']).executeTakeFirstOrThrow())
}

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Programs'), makeShop('Programs elsewhere')])
  await withDb(async (db) => {
    const materials = await db.selectFrom('materials').select(['id', 'name']).where('shop_id', '=', shop.id).execute()
    acrylic = materials.find((m) => m.name === 'Cast acrylic')!.id
    mdf = materials.find((m) => m.name === 'MDF')!.id
    const [machine, manual] = await db.insertInto('machines').values([
      { shop_id: shop.id, name: 'Changer router', min_rpm: 6000, max_rpm: 24000, pockets: 8 },
      { shop_id: shop.id, name: 'Collet router', min_rpm: 10000, max_rpm: 30000, pockets: 0 },
    ]).returning('id').execute()
    const type = (name: string, helix: string, flutes: number) => db.insertInto('cutter_types').values({
      shop_id: shop.id, name, profile: 'square_end', helix: helix as 'upcut', flutes, cutting_diameter_mm: 6.35,
      shank_diameter_mm: 6.35, cutting_length_mm: 22, overall_length_mm: 64, rated_life_minutes: 600, min_usable_diameter_mm: 6, unit_cost_cents: 3000,
    }).returning('id').executeTakeFirstOrThrow()
    const upcut = await type('O-flute upcut 1/4"', 'upcut', 1)
    const downcut = await type('Two-flute downcut 1/4"', 'downcut', 2)
    ids = { machine: machine!.id, manual: manual!.id, upcutType: upcut.id, downcutType: downcut.id }
  })
})

describe('uploading a program', () => {
  it('answers 201 with the reading in the agreed shape, read once and stored', async () => {
    const res = await shop.crib.post('/api/programs', form(METRIC, 'sign-letters.ngc'))
    expect(res.status).toBe(201)
    expect(Object.keys(res.body).sort()).toEqual(['id', 'name', 'problems', 'tools', 'units'])
    expect(res.body).toMatchObject({ name: 'sign-letters.ngc', units: 'mm', problems: [] })
    expect(res.body.tools.map((t: { tool: number }) => t.tool)).toEqual([1, 2])
    expect(Object.keys(res.body.tools[0]).sort()).toEqual(['estimatedMinutes', 'feedDistanceMm', 'feedMinutes', 'feedsMmPerMin', 'maxDepthMm', 'plungeDistanceMm', 'rapidMinutes', 'spindleRpm', 'tool'])
    // The reader on the same text (itself checked against rs274 in the unit tests).
    const reading = readNcProgram(METRIC.toString('utf8'))
    expect(res.body.tools[0].feedDistanceMm).toBeCloseTo(reading.tools[0]!.feedDistanceMm, 3)
    expect(res.body.tools[0].estimatedMinutes).toBeCloseTo(reading.tools[0]!.estimatedMinutes, 4)
    expect(res.body.tools[0]).toMatchObject({ spindleRpm: [18000], feedsMmPerMin: [300, 400, 1200, 1500], maxDepthMm: 7 })

    const list = await shop.operator.get('/api/programs')
    expect(list.status).toBe(200)
    const row = list.body.programs.find((p: { id: number }) => p.id === res.body.id)
    expect(row).toMatchObject({ name: 'sign-letters.ngc', sizeBytes: METRIC.length, tools: [1, 2], uploadedBy: 'Test Crib' })
    expect(row.totalMinutes).toBeCloseTo(reading.tools.reduce((s, t) => s + t.estimatedMinutes, 0), 2)
    expect((await other.owner.get('/api/programs')).body.programs).toEqual([])
    expect((await other.owner.get(`/api/programs/${res.body.id}`)).status).toBe(404)
    expect((await shop.operator.get(`/api/programs/${res.body.id}`)).body.tools).toEqual(res.body.tools)
  })

  it('lists lines it does not read by line, and keeps the program', async () => {
    const res = await shop.crib.post('/api/programs', form('G21\nT1 M6\nG1 X10 F900\nG1 X20 A90\nM30\n'))
    expect(res.status).toBe(201)
    expect(res.body.problems).toEqual([{ line: 4, message: expect.stringMatching(/axis or word A is not read/) }])
  })

  const refused: Array<[string, Buffer | string, number, RegExp]> = [
    ['a binary file', Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A, 0, 0, 0, 13]), 415, /^This is not an NC program: it holds binary data/],
    ['an empty file', '', 400, /^The file is empty/],
    ['a program with no tool change', 'G21\nS18000 M3\nG1 Z-1 F300\nX40\nM30\n', 422, /^Line 3 cuts before any tool change .* which tool number is already in the spindle/],
    ['a feed move before any F', 'G21\nT1 M6\nG1 Z-1\n', 422, /^Line 3: a feed move \(G1\) comes before any feed rate \(F\)/],
    ['an arc whose radius does not fit', 'G21\nT1 M6\nG1 X0 Y0 F800\nG3 X30 Y0 R10\n', 422, /^Line 4: the arc's radius R10 is too small for its end points/],
    ['a million lines of comments', '(a comment)\n'.repeat(1_000_000), 422, /^The file has 1,000,001 lines but not one cutting move/],
  ]
  it.each(refused)('%s answers a sentence and keeps nothing', async (_label, data, status, message) => {
    const before = await programCount(shop.id)
    const res = await shop.crib.post('/api/programs', form(data))
    expect(res.status).toBe(status)
    expect(res.body.message).toMatch(message)
    expect(await programCount(shop.id)).toBe(before)
  })

  it('a program with no tool change is read once told which tool is in the spindle', async () => {
    const first = await shop.operator.post('/api/programs', form('G21\nS18000 M3\nG1 Z-1 F300\nX40\nM30\n'))
    expect(first.body.data).toMatchObject({ ask: 'spindleTool', line: 3 })
    const res = await shop.operator.post('/api/programs', form('G21\nS18000 M3\nG1 Z-1 F300\nX40\nM30\n', 'facing.nc', { spindleTool: '4' }))
    expect(res.status).toBe(201)
    expect(res.body.tools).toMatchObject([{ tool: 4, feedDistanceMm: 41, plungeDistanceMm: 1 }])
  })

  it('refuses a file over 20 MB with a sentence before keeping any of it', async () => {
    const before = await programCount(shop.id)
    const res = await shop.crib.post('/api/programs', form(Buffer.alloc(20 * 1024 * 1024 + 200_000, 0x20)))
    expect(res.status).toBe(413)
    expect(res.body.message).toBe('The program is too large: Kerfbook reads programs of up to 20 MB. Split the job into smaller programs in the CAM software.')
    expect(await programCount(shop.id)).toBe(before)
  })

  it('a request without the file answers 400 naming the field', async () => {
    const f = new FormData()
    f.append('name', 'nothing')
    const res = await shop.crib.post('/api/programs', f)
    expect(res.status).toBe(400)
    expect(res.body.data.fields.file).toMatch(/choose the NC program/)
  })
})

describe('pockets', () => {
  it('a cutter goes into the pocket asked for, a taken pocket answers 409 naming its cutter, and the lowest free one is the default', async () => {
    const [a, b, c] = [await newCutter(ids.upcutType), await newCutter(ids.upcutType), await newCutter(ids.upcutType)]
    expect((await shop.operator.post(`/api/cutters/${a.id}/load`, { machineId: ids.machine, pocket: 5 })).status).toBe(200)
    const taken = await shop.operator.post(`/api/cutters/${b.id}/load`, { machineId: ids.machine, pocket: 5 })
    expect(taken.status).toBe(409)
    expect(taken.body.message).toBe(`Pocket 5 of Changer router holds ${a.code}. Return it first, or choose a free pocket.`)
    expect((await shop.operator.post(`/api/cutters/${b.id}/load`, { machineId: ids.machine, pocket: 9 })).status).toBe(400)
    expect((await shop.operator.post(`/api/cutters/${b.id}/load`, { machineId: ids.machine })).status).toBe(200)
    const machine = (await shop.operator.get(`/api/machines/${ids.machine}`)).body
    expect(machine.loaded).toEqual([{ id: b.id, code: b.code, pocket: 1 }, { id: a.id, code: a.code, pocket: 5 }])
    // Back to the crib, so the checks below start from empty pockets.
    for (const x of [a, b]) await shop.operator.post(`/api/cutters/${x.id}/return`, {})
    void c
  })

  it('the database holds one cutter a pocket even when written around the route', async () => {
    const [a, b] = [await newCutter(ids.upcutType), await newCutter(ids.upcutType)]
    await withDb(async (db) => {
      await db.updateTable('cutters').set({ status: 'in_spindle', machine_id: ids.machine, pocket: 7 }).where('id', '=', a.id).execute()
      await expect(db.updateTable('cutters').set({ status: 'in_spindle', machine_id: ids.machine, pocket: 7 }).where('id', '=', b.id).execute())
        .rejects.toThrow(/cutters_machine_pocket_key/)
      await db.updateTable('cutters').set({ status: 'in_crib', machine_id: null }).where('id', '=', a.id).execute()
    })
  })
})

describe('the check before the job and logging the run', () => {
  let programId: number
  let dull: { id: number, code: string }
  let downcut: { id: number, code: string }

  beforeAll(async () => {
    // T1 and T2 of the metric program: a worn O-flute in pocket 1 and a downcut in pocket 2.
    programId = (await shop.crib.post('/api/programs', form(METRIC, 'acrylic-letters.ngc'))).body.id
    dull = await newCutter(ids.upcutType, { life_used: 0.95 })
    downcut = await newCutter(ids.downcutType)
    await newCutter(ids.upcutType) // a sharp spare in the crib
    await shop.operator.post(`/api/cutters/${dull.id}/load`, { machineId: ids.machine, pocket: 1 })
    await shop.operator.post(`/api/cutters/${downcut.id}/load`, { machineId: ids.machine, pocket: 2 })
  })

  it('shows each tool\'s cutter, life left against minutes needed, and the dull and downcut warnings', async () => {
    const res = await shop.operator.get(`/api/programs/${programId}/check?machineId=${ids.machine}&materialId=${acrylic}&repeats=3`)
    expect(res.status).toBe(200)
    const [t1, t2] = res.body.tools
    expect(t1.cutter.code).toBe(dull.code)
    expect(t2.cutter.code).toBe(downcut.code)
    // Life left = (1 − 0.95) × 600 / 0.9 = 33.33 min (life.ts, Palmgren-Miner).
    expect(t1.cutter.lifeLeftMinutes).toBeCloseTo(33.33, 2)
    expect(t1.minutesNeeded).toBeCloseTo(t1.estimatedMinutes * 3, 4)
    expect(t1.warnings.map((w: { code: string }) => w.code)).toContain('due')
    expect(t2.warnings.map((w: { code: string }) => w.code)).toContain('downcut_in_plastic')
    // Chip load = feed ÷ (rpm × flutes): 1500 / (18000 × 1) for T1 [computed].
    expect(t1.cutter.chipLoadMm).toBeCloseTo(1500 / 18000, 4)
    expect(res.body.cautions.join(' ')).toMatch(/bit maker's data, the machine's manual and local codes govern/)
    // In MDF the downcut is not a plastic warning.
    const inMdf = await shop.operator.get(`/api/programs/${programId}/check?machineId=${ids.machine}&materialId=${mdf}&repeats=1`)
    expect(inMdf.body.tools[1].warnings.map((w: { code: string }) => w.code)).not.toContain('downcut_in_plastic')
  })

  it('says "empty pocket" for a tool whose pocket holds nothing, and other shops get 404', async () => {
    const res = await shop.operator.get(`/api/programs/${programId}/check?machineId=${ids.manual}&materialId=${acrylic}&repeats=1`)
    expect(res.body.tools.every((t: { cutter: unknown, warnings: Array<{ code: string }> }) => t.cutter === null && t.warnings[0]!.code === 'empty_pocket')).toBe(true)
    expect((await other.operator.get(`/api/programs/${programId}/check?machineId=${ids.machine}&materialId=${acrylic}&repeats=1`)).status).toBe(404)
    expect((await shop.operator.get(`/api/programs/${programId}/check?machineId=${ids.machine}&materialId=${acrylic}&repeats=0`)).status).toBe(400)
  })

  it('logs each tool\'s estimate × repeats once per key, with adjustments and the job reference', async () => {
    const check = (await shop.operator.get(`/api/programs/${programId}/check?machineId=${ids.machine}&materialId=${acrylic}&repeats=3`)).body
    const before = await withDb((db) => db.selectFrom('cutters').select(['id', 'minutes_total']).where('id', 'in', [dull.id, downcut.id]).execute())
    const body = { machineId: ids.machine, materialId: acrylic, repeats: 3, jobRef: 'Order 4471', idempotencyKey: 'run-key-0001', adjust: [{ tool: 2, outcome: 'melted' }] }
    const [first, again] = [await shop.operator.post(`/api/programs/${programId}/runs`, body), await shop.operator.post(`/api/programs/${programId}/runs`, body)]
    expect(first.status).toBe(201)
    expect(again.status).toBe(200)
    expect(again.body.logs.map((l: { logId: string }) => l.logId)).toEqual(first.body.logs.map((l: { logId: string }) => l.logId))
    expect(first.body.logs).toMatchObject([
      { tool: 1, cutterId: dull.id, minutes: Math.round(check.tools[0].estimatedMinutes * 3 * 100) / 100, outcome: 'clean', rpm: 18000, feedMmPerMin: 1500 },
      { tool: 2, cutterId: downcut.id, minutes: Math.round(check.tools[1].estimatedMinutes * 3 * 100) / 100, outcome: 'melted', rpm: 22000 },
    ])
    const after = await withDb((db) => db.selectFrom('cutters').select(['id', 'minutes_total']).where('id', 'in', [dull.id, downcut.id]).execute())
    for (const c of after) {
      const was = before.find((b) => b.id === c.id)!.minutes_total
      const logged = first.body.logs.find((l: { cutterId: number }) => l.cutterId === c.id).minutes
      expect(c.minutes_total).toBeCloseTo(was + logged, 2)
    }
    const notes = await withDb((db) => db.selectFrom('cut_logs').select('note').where('cutter_id', '=', dull.id).execute())
    expect(notes.map((n) => n.note)).toEqual(['Program acrylic-letters.ngc, T1, 3 repeats, job Order 4471'])

    const adjusted = await shop.operator.post(`/api/programs/${programId}/runs`, { ...body, idempotencyKey: 'run-key-0002', repeats: 1, adjust: [{ tool: 1, minutes: 2.5 }] })
    expect(adjusted.status).toBe(201)
    expect(adjusted.body.logs[0].minutes).toBe(2.5)
    const wrongTool = await shop.operator.post(`/api/programs/${programId}/runs`, { ...body, idempotencyKey: 'run-key-0003', adjust: [{ tool: 9, minutes: 1 }] })
    expect(wrongTool.status).toBe(400)
    expect(wrongTool.body.message).toMatch(/the program calls no tool T9/)
  })

  it('carries each tool\'s cleanup minutes per part to that tool\'s cut log and the owner\'s cleanup table', async () => {
    const run = (key: string, adjust: unknown[]) => shop.operator.post(`/api/programs/${programId}/runs`,
      { machineId: ids.machine, materialId: acrylic, repeats: 1, idempotencyKey: key, adjust })
    const first = await run('run-key-cleanup-1', [{ tool: 1, outcome: 'fuzzy', cleanupMinutesPerPart: 4 }, { tool: 2, outcome: 'melted', cleanupMinutesPerPart: 7.5 }])
    expect(first.status).toBe(201)
    expect(first.body.logs).toMatchObject([
      { tool: 1, cutterId: dull.id, outcome: 'fuzzy', cleanupMinutesPerPart: 4 },
      { tool: 2, cutterId: downcut.id, outcome: 'melted', cleanupMinutesPerPart: 7.5 },
    ])
    // A tool left out of `adjust` logs a clean cut with no cleanup.
    const second = await run('run-key-cleanup-2', [{ tool: 2, outcome: 'melted', cleanupMinutesPerPart: 2.5 }])
    expect(second.body.logs).toMatchObject([{ tool: 1, outcome: 'clean', cleanupMinutesPerPart: null }, { tool: 2, cleanupMinutesPerPart: 2.5 }])

    const stored = await withDb((db) => db.selectFrom('cut_logs').select(['id', 'cutter_id', 'outcome', 'cleanup_minutes_per_part'])
      .where('id', 'in', [...first.body.logs, ...second.body.logs].map((l: { logId: string }) => l.logId)).orderBy('id').execute())
    expect(stored.map((l) => [l.cutter_id, l.outcome, l.cleanup_minutes_per_part])).toEqual([
      [dull.id, 'fuzzy', 4], [downcut.id, 'melted', 7.5], [dull.id, 'clean', null], [downcut.id, 'melted', 2.5],
    ])

    // By type × material, over the logs that gave cleanup: the O-flute 4 min a part from one log,
    // the downcut (7.5 + 2.5) / 2 = 5 min a part from two (worked by hand).
    const table = await shop.owner.get('/api/insights/cleanup')
    expect(table.status).toBe(200)
    const row = (typeId: number) => table.body.rows.find((r: { typeId: number, materialId: number }) => r.typeId === typeId && r.materialId === acrylic)
    expect(row(ids.upcutType)).toMatchObject({ cleanupLogs: 1, cleanupMinutesPerPart: 4, fuzzy: 1 })
    expect(row(ids.downcutType)).toMatchObject({ cleanupLogs: 2, cleanupMinutesPerPart: 5 })

    // The cut log's limits: 0 to 600 minutes, the field named.
    const over = await run('run-key-cleanup-3', [{ tool: 2, outcome: 'melted', cleanupMinutesPerPart: 600.5 }])
    expect(over.status).toBe(400)
    expect(over.body.data.fields['adjust.0.cleanupMinutesPerPart']).toMatch(/at most 600 minutes/)
    expect((await run('run-key-cleanup-4', [{ tool: 2, outcome: 'melted', cleanupMinutesPerPart: -1 }])).body.data.fields['adjust.0.cleanupMinutesPerPart']).toMatch(/0 or more/)
  })

  it('refuses to log a run with an empty pocket, naming it', async () => {
    const res = await shop.operator.post(`/api/programs/${programId}/runs`, { machineId: ids.manual, materialId: acrylic, repeats: 1, idempotencyKey: 'run-key-empty' })
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/^T1 \(pocket 1\), T2 \(pocket 1\) have no cutter in Collet router/)
  })
})
