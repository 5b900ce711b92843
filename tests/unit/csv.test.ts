// Reading CSV the way a spreadsheet numbers its rows, writing it without runnable formulas, and
// the two imports' rows read into the same inputs the forms send.
import { readFileSync } from 'node:fs'
import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { neutraliseCell, parseCsv, toCsv } from '../../shared/kerf/csv'
import {
  CUTTER_COLUMNS, readCutterCsv, readCutterTypeCsv, TYPE_COLUMNS, type TypeForImport,
} from '../../shared/schemas/crib-csv'

const template = (name: string) => readFileSync(new URL(`../../public/templates/${name}`, import.meta.url), 'utf8')
const HEADER = TYPE_COLUMNS.join(',')
const GOOD = 'Upcut 1/4,,P-1,square_end,,upcut,solid_carbide,2,6.35,6.35,22,64,900,2,0.2,6,39.00,12.00,2,95,'
const noLookups = { suppliers: new Map<string, number>(), takenNames: new Set<string>() }

describe('parsing', () => {
  it('numbers rows as a spreadsheet does: header is row 1, a quoted line break stays in its row, blank lines count', () => {
    const parsed = parseCsv('a,b\r\n1,"two\nlines"\r\n\r\n3,4\r\n', ['a', 'b'], ['a'])
    expect(parsed.problems).toEqual([])
    expect(parsed.rows).toEqual([{ row: 2, cells: { a: '1', b: 'two\nlines' } }, { row: 4, cells: { a: '3', b: '4' } }])
  })

  it('reads a block pasted from a spreadsheet (tabs) and tidies header words', () => {
    const parsed = parseCsv('Type\tDiameter mm\nUpcut\t6.35\n', ['type', 'diameter_mm'], ['type'])
    expect(parsed.columns).toEqual(['type', 'diameter_mm'])
    expect(parsed.rows[0]!.cells).toEqual({ type: 'Upcut', diameter_mm: '6.35' })
  })

  it('names unknown, doubled and missing columns on row 1, and a row with too many cells', () => {
    const parsed = parseCsv('type,colour,type\nA,red,A,extra\n', ['type', 'note'], ['type', 'note'])
    expect(parsed.problems).toEqual(expect.arrayContaining([
      expect.objectContaining({ row: 1, field: 'colour', message: expect.stringMatching(/unknown column/) }),
      expect.objectContaining({ row: 1, field: 'type', message: 'this column appears twice' }),
      expect.objectContaining({ row: 1, field: 'note', message: 'this column is missing from the header row' }),
      expect.objectContaining({ row: 2, message: expect.stringMatching(/4 cells but the header names 3/) }),
    ]))
  })
})

describe('writing', () => {
  // OWASP, "CSV Injection": cells starting with = + - @ tab or carriage return.
  it.each(['=1+1', '+SUM(A1)', '-2+3', '@cmd', '\tx', '=HYPERLINK("x")\nsecond line'])('neutralises %j', (cell) => {
    expect(neutraliseCell(cell)).toBe(`'${cell}`)
  })

  it('leaves numbers and ordinary text alone', () => {
    expect(neutraliseCell(-3)).toBe(-3)
    expect(neutraliseCell('Upcut 1/4"')).toBe('Upcut 1/4"')
    expect(neutraliseCell(null)).toBe('')
  })

  // The same attack after a separator that spreadsheets of other locales split on (semicolon,
  // tab, pipe, comma, a line break): opened that way, the cell splits and its second part runs.
  it.each([['a;=1+1', 'a;\'=1+1'], ['x,-2+3', 'x,\'-2+3'], ['x\t@cmd', 'x\t\'@cmd'], ['a|+1', 'a|\'+1'], ['a; "=1', 'a; "\'=1'], ['a\n=1', 'a\n\'=1']])(
    'neutralises a formula after a separator in %j', (cell, safe) => {
      expect(neutraliseCell(cell)).toBe(safe)
    })

  it('starts with a UTF-8 byte-order mark so that spreadsheets read ° and ×', () => {
    expect(toCsv(['note'], [['90° V × 2']]).startsWith('\uFEFFnote\r\n')).toBe(true)
  })

  it('writes CSV that papaparse reads back', () => {
    const text = toCsv(['code', 'note'], [['K7Q2', 'has, comma and "quotes"'], ['ZX4H', '=cmd']]).slice(1)
    const back = Papa.parse<string[]>(text, { skipEmptyLines: true }).data
    expect(back).toEqual([['code', 'note'], ['K7Q2', 'has, comma and "quotes"'], ['ZX4H', '\'=cmd']])
  })
})

describe('cutter type rows', () => {
  it('reads a good row into the form\'s fields: mm, cents, a fraction for the service level', () => {
    const read = readCutterTypeCsv(`${HEADER}\n${GOOD}\n`, { suppliers: new Map([['ridge tools', 7]]), takenNames: new Set() })
    expect(read.problems).toEqual([])
    expect(read.values[0]).toMatchObject({
      row: 2, name: 'Upcut 1/4', supplierId: null, profile: 'square_end', flutes: 2, cuttingDiameterMm: 6.35,
      unitCostCents: 3900, regrindCostCents: 1200, serviceLevel: 0.95, leadTimeDaysOverride: null, vAngleDeg: null,
    })
  })

  it('accepts words as people write them and finds the supplier by name in any case', () => {
    const row = 'V 60,Ridge Tools,,V-bit,60,Straight,Solid carbide,2,12.7,6.35,11,63.5,900,1,0.1,12.5,$32,10,1,0.95,'
    const read = readCutterTypeCsv(`${HEADER}\n${row}\n`, { suppliers: new Map([['ridge tools', 7]]), takenNames: new Set() })
    expect(read.problems).toEqual([])
    expect(read.values[0]).toMatchObject({ supplierId: 7, profile: 'v_bit', vAngleDeg: 60, helix: 'straight', toolMaterial: 'solid_carbide', unitCostCents: 3200 })
  })

  it('names the row and column of every problem, the rules between fields included', () => {
    const rows = [
      GOOD,
      GOOD.replace('Upcut 1/4', 'Short').replace(',22,64,', ',22,20,'),
      GOOD.replace('Upcut 1/4', 'Vee').replace('square_end,,', 'v_bit,,'),
      GOOD.replace('Upcut 1/4', 'Nope').replace(',,P-1,', ',Nowhere Inc,P-1,').replace(',2,6.35,6.35,', ',two,6.35,6.35,').replace('39.00', '39.999'),
      GOOD,
    ]
    const read = readCutterTypeCsv(`${HEADER}\n${rows.join('\n')}\n`, { ...noLookups, takenNames: new Set(['short']) })
    const at = (row: number) => read.problems.filter((p) => p.row === row).map((p) => p.field).sort()
    expect(at(2)).toEqual([])
    expect(at(3)).toEqual(['name', 'overall_length_mm'])
    expect(at(4)).toEqual(['v_angle_deg'])
    expect(at(5)).toEqual(['flutes', 'supplier', 'unit_cost'])
    expect(read.problems.find((p) => p.row === 6)).toMatchObject({ field: 'name', message: 'the same name is on row 2' })
    expect(read.values.map((v) => v.row)).toEqual([2])
  })

  it('refuses a file with no rows', () => {
    expect(readCutterTypeCsv(`${HEADER}\n`, noLookups).problems).toEqual([{ row: 2, field: '', message: 'there are no rows under the header' }])
  })
})

describe('cutter rows', () => {
  const types = new Map<string, TypeForImport>([
    ['upcut 1/4', { id: 11, name: 'Upcut 1/4', cuttingDiameterMm: 6.35, maxRegrinds: 2, active: true }],
    ['old v-bit', { id: 12, name: 'Old V-bit', cuttingDiameterMm: 12.7, maxRegrinds: 1, active: false }],
  ])

  it('fills a blank diameter from the type and a blank status with in_crib', () => {
    const read = readCutterCsv('type,diameter_mm,status,regrind_count,life_used_percent,note\nupcut 1/4,,,,,\nUpcut 1/4,6.1,In crib,1,40 %,back\n', types)
    expect(read.problems).toEqual([])
    expect(read.values).toEqual([
      { row: 2, typeId: 11, diameterMm: 6.35, status: 'in_crib', regrindCount: 0, lifeUsed: 0, note: '' },
      { row: 3, typeId: 11, diameterMm: 6.1, status: 'in_crib', regrindCount: 1, lifeUsed: 0.4, note: 'back' },
    ])
  })

  it('refuses a cutter "at regrind", which no batch could ever receive, and says what to do instead', () => {
    const read = readCutterCsv('type,status\nUpcut 1/4,At regrind\n', types)
    expect(read.values).toEqual([])
    expect(read.problems).toEqual([{ row: 2, field: 'status', message: expect.stringMatching(/^cannot be at_regrind: import it as in_crib, then put it in a resharpening batch/) }])
  })

  it('names unknown and archived types, statuses it cannot import, and too many regrinds', () => {
    const read = readCutterCsv('type,status,regrind_count\nNo such,,\nOld V-bit,,\nUpcut 1/4,retired,\nUpcut 1/4,,3\n', types)
    expect(read.problems.map((p) => [p.row, p.field])).toEqual([[2, 'type'], [3, 'type'], [4, 'status'], [5, 'regrind_count']])
    expect(read.values).toEqual([])
  })
})

describe('the downloadable templates', () => {
  it('have exactly the import columns and import cleanly, types first and then their cutters', () => {
    const typesCsv = template('cutter-types.csv')
    expect(typesCsv.split(/\r?\n/)[0]).toBe(TYPE_COLUMNS.join(','))
    const typesRead = readCutterTypeCsv(typesCsv, noLookups)
    expect(typesRead.problems).toEqual([])
    const cuttersCsv = template('cutters.csv')
    expect(cuttersCsv.split(/\r?\n/)[0]).toBe(CUTTER_COLUMNS.join(','))
    const catalogue = new Map(typesRead.values.map((t, i) => [t.name.toLowerCase(), {
      id: i + 1, name: t.name, cuttingDiameterMm: t.cuttingDiameterMm, maxRegrinds: t.maxRegrinds ?? 2, active: true,
    }]))
    const cuttersRead = readCutterCsv(cuttersCsv, catalogue)
    expect(cuttersRead.problems).toEqual([])
    expect(cuttersRead.values).toHaveLength(3)
  })
})
