// CSV in and out: an import writes every row or none (the bad rows named by row and column), a
// dry run writes nothing, imported cutters get label codes; exports are downloads that parse
// back with papaparse, with formula cells neutralised.
import Papa from 'papaparse'
import { beforeAll, describe, expect, it } from 'vitest'
import { TYPE_COLUMNS } from '../../shared/schemas/crib-csv'
import { appDb } from '../support/db'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let other: TestShop
let fx: SpindleFixture

const HEADER = TYPE_COLUMNS.join(',')
const typeRow = (name: string, change: (row: string) => string = (r) => r) =>
  change(`${name},Birch Row Supply,BR-1,square_end,,upcut,solid_carbide,2,6.35,6.35,22,64,900,2,0.2,6,39.50,12,2,95,`)

async function count(table: 'cutter_types' | 'cutters' | 'uploads', shopId = shop.id): Promise<number> {
  const db = appDb()
  try {
    const r = await db.selectFrom(table).select((eb) => eb.fn.countAll<number>().as('n')).where('shop_id', '=', shopId).executeTakeFirstOrThrow()
    return Number(r.n)
  } finally {
    await db.destroy()
  }
}

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Csv'), makeShop('Other')])
  fx = await addSpindleFixture(shop.id, 2)
  await shop.crib.post('/api/suppliers', { name: 'Birch Row Supply' })
})

describe('importing cutter types', () => {
  it('a good CSV imports every row, with the supplier found by name and money in cents', async () => {
    const before = await count('cutter_types')
    const csv = [HEADER, typeRow('Imported A'), typeRow('Imported B'), typeRow('Imported V', (r) => r.replace('square_end,,', 'v_bit,90,'))].join('\n')
    const res = await shop.crib.post('/api/import/cutter-types', { csv, filename: 'catalogue.csv' })
    expect(res.status).toBe(201)
    expect(res.body.imported).toBe(3)
    expect(await count('cutter_types')).toBe(before + 3)
    const list = (await shop.crib.get('/api/cutter-types')).body as Array<Record<string, unknown>>
    expect(list.find((t) => t.name === 'Imported V')).toMatchObject({ profile: 'v_bit', vAngleDeg: 90, unitCostCents: 3950, regrindCostCents: 1200, supplierName: 'Birch Row Supply', serviceLevel: 0.95 })
  })

  it('one bad row among good ones rejects the whole file, naming the row and column, and writes nothing', async () => {
    const before = await count('cutter_types')
    const uploadsBefore = await count('uploads')
    const csv = [HEADER, typeRow('Fine 1'), typeRow('Fine 2'), typeRow('Too short', (r) => r.replace(',22,64,', ',22,12,')), typeRow('Fine 3')].join('\n')
    const res = await shop.crib.post('/api/import/cutter-types', { csv })
    expect(res.status).toBe(400)
    expect(res.body.data.rows).toEqual([{ row: 4, field: 'overall_length_mm', message: 'must be at least the cutting length' }])
    expect(res.body.message).toMatch(/^Nothing was imported: one row has a problem\. row 4, overall_length_mm/)
    expect(await count('cutter_types')).toBe(before)
    expect(await count('uploads')).toBe(uploadsBefore)
  })

  it('a dry run answers the preview and every problem, and writes nothing', async () => {
    const before = await count('cutter_types')
    const csv = [HEADER, typeRow('Preview 1'), typeRow('Imported A'), typeRow('Preview 3', (r) => r.replace('Birch Row Supply', 'Nobody Ltd'))].join('\n')
    const res = await shop.crib.post('/api/import/cutter-types', { csv, dryRun: true })
    expect(res.status).toBe(200)
    expect(res.body.ok).toBe(false)
    expect(res.body.preview.map((r: { row: number }) => r.row)).toEqual([2, 3, 4])
    expect(res.body.preview[0].cells).toMatchObject({ name: 'Preview 1', unit_cost: '39.50' })
    expect(res.body.errors.map((e: { row: number, field: string }) => [e.row, e.field])).toEqual([[3, 'name'], [4, 'supplier']])
    expect(await count('cutter_types')).toBe(before)

    const good = await shop.crib.post('/api/import/cutter-types', { csv: [HEADER, typeRow('Preview 1')].join('\n'), dryRun: true })
    expect(good.body).toMatchObject({ dryRun: true, ok: true, errors: [] })
    expect(await count('cutter_types')).toBe(before)
  })

  it('a file over 2 MB is a 413 that says so', async () => {
    const csv = `${HEADER}\n${typeRow('x'.repeat(100)).concat('\n').repeat(12_000)}`
    const res = await shop.crib.post('/api/import/cutter-types', { csv, dryRun: true })
    expect(res.status).toBe(413)
    expect(res.body.message).toMatch(/at most 2 MB/)
  })

  it('an empty body is a 400 naming csv', async () => {
    const res = await shop.crib.post('/api/import/cutter-types', { csv: '' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.csv).toBe('paste or upload a CSV')
  })
})

describe('importing cutters already in the shop', () => {
  it('gives each a label code, keeps status, regrinds and life used, and names them for the label sheet', async () => {
    const before = await count('cutters')
    const csv = 'type,diameter_mm,status,regrind_count,life_used_percent,note\n'
      + 'Two-flute upcut 1/4",,in_crib,0,0,\n'
      + 'two-flute upcut 1/4",6.1,in_crib,1,100,back from batch 4\n'
      + 'Two-flute upcut 1/4",6.2,lost,,,'
    const res = await shop.crib.post('/api/import/cutters', { csv })
    expect(res.status).toBe(201)
    expect(res.body.imported).toBe(3)
    expect(res.body.codes).toHaveLength(3)
    expect(await count('cutters')).toBe(before + 3)
    const db = appDb()
    try {
      const rows = await db.selectFrom('cutters').selectAll().where('id', 'in', res.body.ids).orderBy('id').execute()
      expect(rows.map((r) => [r.type_id, r.status, r.diameter_mm, r.regrind_count, r.life_used, r.life_scale])).toEqual([
        [fx.typeId, 'in_crib', 6.35, 0, 0, 1],
        [fx.typeId, 'in_crib', 6.1, 1, 1, 0.8],
        [fx.typeId, 'lost', 6.2, 0, 0, 1],
      ])
      expect(rows.map((r) => r.code)).toEqual(res.body.codes)
      const events = await db.selectFrom('cutter_events').select(['kind', 'note']).where('cutter_id', 'in', res.body.ids).execute()
      expect(events).toHaveLength(3)
      expect(events.every((e) => e.kind === 'received')).toBe(true)
      expect(events.some((e) => e.note.endsWith('row 3): back from batch 4'))).toBe(true)
    } finally {
      await db.destroy()
    }
  })

  it('one unknown type among good rows writes no cutter at all', async () => {
    const before = await count('cutters')
    const csv = 'type,status\nTwo-flute upcut 1/4",in_crib\nMystery bit,in_crib\nTwo-flute upcut 1/4",retired\n'
    const res = await shop.crib.post('/api/import/cutters', { csv })
    expect(res.status).toBe(400)
    expect(res.body.data.rows).toEqual([
      { row: 3, field: 'type', message: 'no cutter type named "Mystery bit" in the catalogue' },
      { row: 4, field: 'status', message: 'must be in_crib or lost' },
    ])
    expect(await count('cutters')).toBe(before)
  })

  it('another shop\'s type names are unknown here', async () => {
    const res = await other.crib.post('/api/import/cutters', { csv: 'type\nTwo-flute upcut 1/4"\n', dryRun: true })
    expect(res.body.errors[0]).toMatchObject({ row: 2, field: 'type' })
    expect(await count('cutters', other.id)).toBe(0)
  })
})

describe('exports', () => {
  it('the inventory is a CSV download that parses back, one row per cutter, formulas neutralised', async () => {
    const db = appDb()
    try {
      await db.updateTable('cutters').set({ life_used: 0.456, minutes_total: 123.5 }).where('id', '=', fx.cutters[0]!.id).execute()
    } finally {
      await db.destroy()
    }
    const evil = await shop.crib.post('/api/cutter-types', {
      name: '=HYPERLINK("http://example.com","x")', profile: 'square_end', helix: 'upcut', flutes: 2, cuttingDiameterMm: 3, shankDiameterMm: 3,
      cuttingLengthMm: 10, overallLengthMm: 40, ratedLifeMinutes: 300, minUsableDiameterMm: 2.9, unitCostCents: 1000,
    })
    await shop.crib.post('/api/import/cutters', { csv: `type\n"${evil.body.name.replace(/"/g, '""')}"\n` })

    const res = await shop.crib.get<string>('/api/export/inventory.csv')
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="inventory-\d{4}-\d{2}-\d{2}\.csv"$/)
    // A byte-order mark first (EF BB BF), so that spreadsheets read the file as UTF-8 (The Unicode
    // Standard, section 23.8). Reading the answer as text drops it, as a spreadsheet does.
    const bytes = new Uint8Array(await (await shop.crib.raw('/api/export/inventory.csv')).arrayBuffer())
    expect([...bytes.slice(0, 3)]).toEqual([0xEF, 0xBB, 0xBF])
    const parsed = Papa.parse<Record<string, string>>(res.body, { header: true, skipEmptyLines: true })
    expect(parsed.errors).toEqual([])
    expect(parsed.data).toHaveLength(await count('cutters'))
    expect(parsed.meta.fields).toEqual(['code', 'type', 'status', 'machine', 'diameter_mm', 'regrind_count', 'life_used_percent', 'minutes_total'])
    expect(parsed.data.find((r) => r.code === fx.cutters[0]!.code)).toMatchObject({ life_used_percent: '45.6', minutes_total: '123.5', status: 'In the crib' })
    expect(parsed.data.filter((r) => r.type === `'${evil.body.name}`)).toHaveLength(1)
    expect(parsed.data.some((r) => r.type?.startsWith('='))).toBe(false)
  })

  it('cut logs between two of the shop\'s days (midnight to midnight in its zone), both included, with the operator and a neutralised note', async () => {
    const materials = (await shop.operator.get('/api/materials')).body as Array<{ id: number, name: string }>
    const db = appDb()
    try {
      const base = { shop_id: shop.id, cutter_id: fx.cutters[1]!.id, machine_id: fx.machines.changer, operator_id: shop.ids.operator, material_id: materials[0]!.id, wear_factor: 1, life_added: 0.01, outcome: 'clean' as const }
      await db.insertInto('cut_logs').values([
        { ...base, minutes: 10, idempotency_key: `csv-${Date.now()}-a`, cut_at: '2026-03-31T23:59:59Z' },
        { ...base, minutes: 11, idempotency_key: `csv-${Date.now()}-b`, cut_at: '2026-04-01T04:59:59Z' },
        { ...base, minutes: 12, idempotency_key: `csv-${Date.now()}-c`, cut_at: '2026-04-01T05:00:00Z', rpm: 18000, feed_mm_per_min: 2500, note: '@SUM(1,2) melted edge' },
        { ...base, minutes: 13, idempotency_key: `csv-${Date.now()}-d`, cut_at: '2026-04-03T04:59:59Z' },
        { ...base, minutes: 14, idempotency_key: `csv-${Date.now()}-e`, cut_at: '2026-04-03T05:00:00Z' },
      ]).execute()
    } finally {
      await db.destroy()
    }
    await shop.owner.patch('/api/shop', { timeZone: 'America/Chicago' })
    const res = await shop.crib.get<string>('/api/export/cut-logs.csv?from=2026-04-01&to=2026-04-02')
    expect(res.status).toBe(200)
    expect(res.headers.get('content-disposition')).toBe('attachment; filename="cut-logs-2026-04-01-to-2026-04-02.csv"')
    const parsed = Papa.parse<Record<string, string>>(res.body, { header: true, skipEmptyLines: true })
    // The shop's zone here is America/Chicago, CDT (UTC-5) in April 2026 (IANA tz database): its
    // 1 April runs from 05:00 UTC that day to 05:00 UTC on the 2nd.
    expect(parsed.data.map((r) => r.minutes)).toEqual(['12', '13'])
    expect(parsed.data[0]).toMatchObject({
      date: '2026-04-01', time: '00:00', time_zone: 'America/Chicago', cutter_code: fx.cutters[1]!.code, type: 'Two-flute upcut 1/4"', machine: 'Big table with changer',
      operator: 'Test Operator', material: materials[0]!.name, outcome: 'Clean', rpm: '18000', feed_mm_per_min: '2500', note: '\'@SUM(1,2) melted edge',
    })
    const elsewhere = await other.crib.get('/api/export/cut-logs.csv?from=2026-04-01&to=2026-04-02')
    expect(elsewhere.body.trim().split('\n')).toHaveLength(1)
  })

  it('a backwards or malformed range is a 400 naming the field', async () => {
    expect((await shop.crib.get('/api/export/cut-logs.csv?from=2026-04-05&to=2026-04-01')).body.data.fields.to).toMatch(/on or after/)
    expect((await shop.crib.get('/api/export/cut-logs.csv?from=yesterday')).body.data.fields.from).toMatch(/date like/)
  })
})
