// The two CSV imports, cutter types and cutters already in the shop: their columns, and each row
// read into the same inputs the forms send, with every problem named by row and column. Pure:
// the route passes in what it looked up (suppliers, types, names taken).
import { z } from 'zod'
import { normaliseWord } from '../kerf/geometry'
import { parseCsv, type CsvRow, type RowProblem } from '../kerf/csv'
import { parseMoney } from '../kerf/money'
import { parseDecimal, parsePercent, parseServiceLevel } from '../kerf/numbers'
import { CutterTypeBody, type CutterTypeValue } from './crib'

export const IMPORT_KINDS = ['cutter-types', 'cutters'] as const
export type ImportKind = (typeof IMPORT_KINDS)[number]

export const TYPE_COLUMNS = [
  'name', 'supplier', 'supplier_part_number', 'profile', 'v_angle_deg', 'helix', 'tool_material', 'flutes',
  'cutting_diameter_mm', 'shank_diameter_mm', 'cutting_length_mm', 'overall_length_mm', 'rated_life_minutes', 'max_regrinds',
  'regrind_diameter_loss_mm', 'min_usable_diameter_mm', 'unit_cost', 'regrind_cost', 'pack_size', 'service_level', 'lead_time_days',
] as const
export const TYPE_REQUIRED = ['name', 'profile', 'helix', 'flutes', 'cutting_diameter_mm', 'shank_diameter_mm', 'cutting_length_mm',
  'overall_length_mm', 'rated_life_minutes', 'min_usable_diameter_mm', 'unit_cost'] as const

export const CUTTER_COLUMNS = ['type', 'diameter_mm', 'status', 'regrind_count', 'life_used_percent', 'note'] as const
export const CUTTER_REQUIRED = ['type'] as const
// Not at_regrind: a cutter is out for resharpening only inside a batch that can come back, so
// one at the regrinder today is imported in_crib and sent in a batch (else nothing could receive it).
export const IMPORT_STATUSES = ['in_crib', 'lost'] as const
const AT_REGRIND_ON_IMPORT = 'cannot be at_regrind: import it as in_crib, then put it in a resharpening batch and send the batch, so that it can be received back'

/** Imports are written in one statement each; these keep them well inside PostgreSQL's parameter limit. */
export const MAX_IMPORT_ROWS: Record<ImportKind, number> = { 'cutter-types': 1000, 'cutters': 5000 }

/** The form's field names back to the CSV's column names, for problems. */
const TYPE_FIELD_COLUMN: Record<string, string> = {
  supplierId: 'supplier', supplierPartNumber: 'supplier_part_number', vAngleDeg: 'v_angle_deg', toolMaterial: 'tool_material',
  cuttingDiameterMm: 'cutting_diameter_mm', shankDiameterMm: 'shank_diameter_mm', cuttingLengthMm: 'cutting_length_mm',
  overallLengthMm: 'overall_length_mm', ratedLifeMinutes: 'rated_life_minutes', maxRegrinds: 'max_regrinds',
  regrindDiameterLossMm: 'regrind_diameter_loss_mm', minUsableDiameterMm: 'min_usable_diameter_mm', unitCostCents: 'unit_cost',
  regrindCostCents: 'regrind_cost', packSize: 'pack_size', serviceLevel: 'service_level', leadTimeDaysOverride: 'lead_time_days',
}

// A cell that does not read as a number is passed on as text, so the schema names what it expected.
const number = (cell: string | undefined) => (!cell ? undefined : parseDecimal(cell) ?? cell)
const money = (cell: string | undefined) => (!cell ? undefined : parseMoney(cell) ?? cell)
const word = (cell: string | undefined) => (!cell ? undefined : normaliseWord(cell))
const key = (name: string) => name.trim().toLowerCase()

export interface ImportResult<T> { rows: CsvRow[], values: Array<T & { row: number }>, problems: RowProblem[] }

function readRows<T>(text: string, kind: ImportKind, columns: readonly string[], required: readonly string[],
  readRow: (row: CsvRow, problems: RowProblem[]) => T | undefined): ImportResult<T> {
  const parsed = parseCsv(text, columns, required)
  const problems = [...parsed.problems]
  if (!parsed.rows.length && !problems.length) problems.push({ row: 2, field: '', message: 'there are no rows under the header' })
  if (parsed.rows.length > MAX_IMPORT_ROWS[kind]) {
    problems.push({ row: 1, field: '', message: `at most ${MAX_IMPORT_ROWS[kind]} rows at a time: split the file` })
    return { rows: parsed.rows, values: [], problems }
  }
  const values: Array<T & { row: number }> = []
  for (const row of parsed.rows) {
    const value = readRow(row, problems)
    if (value) values.push({ ...value, row: row.row })
  }
  return { rows: parsed.rows, values, problems }
}

export interface TypeLookups {
  /** Supplier ids by lower-cased name. */
  suppliers: Map<string, number>
  /** Lower-cased names already in the catalogue. */
  takenNames: Set<string>
}

export function readCutterTypeCsv(text: string, lookups: TypeLookups): ImportResult<CutterTypeValue> {
  const namesInFile = new Map<string, number>()
  return readRows(text, 'cutter-types', TYPE_COLUMNS, TYPE_REQUIRED, ({ row, cells }, problems) => {
    const before = problems.length
    let supplierId: number | null = null
    if (cells.supplier) {
      supplierId = lookups.suppliers.get(key(cells.supplier)) ?? null
      if (supplierId === null) problems.push({ row, field: 'supplier', message: `no supplier named "${cells.supplier}": add it on the Suppliers page first` })
    }
    const input = {
      name: cells.name ?? '',
      supplierId,
      supplierPartNumber: cells.supplier_part_number || null,
      profile: word(cells.profile),
      vAngleDeg: cells.v_angle_deg ? number(cells.v_angle_deg) : null,
      helix: word(cells.helix),
      toolMaterial: word(cells.tool_material),
      flutes: number(cells.flutes),
      cuttingDiameterMm: number(cells.cutting_diameter_mm),
      shankDiameterMm: number(cells.shank_diameter_mm),
      cuttingLengthMm: number(cells.cutting_length_mm),
      overallLengthMm: number(cells.overall_length_mm),
      ratedLifeMinutes: number(cells.rated_life_minutes),
      maxRegrinds: number(cells.max_regrinds),
      regrindDiameterLossMm: number(cells.regrind_diameter_loss_mm),
      minUsableDiameterMm: number(cells.min_usable_diameter_mm),
      unitCostCents: money(cells.unit_cost),
      regrindCostCents: money(cells.regrind_cost),
      packSize: number(cells.pack_size),
      serviceLevel: !cells.service_level ? undefined : parseServiceLevel(cells.service_level) ?? cells.service_level,
      leadTimeDaysOverride: cells.lead_time_days ? number(cells.lead_time_days) : null,
    }
    const result = CutterTypeBody.safeParse(input)
    if (!result.success) {
      for (const issue of result.error.issues) {
        const field = String(issue.path[0] ?? '')
        problems.push({ row, field: TYPE_FIELD_COLUMN[field] ?? field, message: issue.message })
      }
    }
    const name = key(cells.name ?? '')
    if (name && lookups.takenNames.has(name)) {
      problems.push({ row, field: 'name', message: 'a cutter type with this name is already in the catalogue: change it there, or rename this row' })
    } else if (name && namesInFile.has(name)) {
      problems.push({ row, field: 'name', message: `the same name is on row ${namesInFile.get(name)}` })
    } else if (name) {
      namesInFile.set(name, row)
    }
    return problems.length === before && result.success ? result.data : undefined
  })
}

export interface TypeForImport { id: number, name: string, cuttingDiameterMm: number, maxRegrinds: number, active: boolean }

const CutterRow = z.object({
  diameterMm: z.number({ error: 'enter a diameter in millimetres' }).min(0.001, { error: 'must be at least 0.001 mm' }).max(1000, { error: 'must be at most 1000 mm' }),
  status: z.enum(IMPORT_STATUSES, { error: (issue) => (issue.input === 'at_regrind' ? AT_REGRIND_ON_IMPORT : 'must be in_crib or lost') }),
  regrindCount: z.number({ error: 'enter a whole number' }).int({ error: 'must be a whole number' }).min(0, { error: 'cannot be negative' }).max(20, { error: 'must be at most 20' }),
  lifeUsed: z.number({ error: 'enter a percentage like 40' }).min(0, { error: 'cannot be negative' }).max(10, { error: 'must be at most 1000' }),
  note: z.string().max(2000, { error: 'use at most 2000 characters' }),
})
const CUTTER_FIELD_COLUMN: Record<string, string> = { diameterMm: 'diameter_mm', regrindCount: 'regrind_count', lifeUsed: 'life_used_percent' }

export interface CutterImportValue extends z.output<typeof CutterRow> { typeId: number }

/** Cutters already in the shop; a blank diameter is the type's cutting diameter, a blank status in_crib. */
export function readCutterCsv(text: string, types: Map<string, TypeForImport>): ImportResult<CutterImportValue> {
  return readRows(text, 'cutters', CUTTER_COLUMNS, CUTTER_REQUIRED, ({ row, cells }, problems) => {
    const before = problems.length
    const type = cells.type ? types.get(key(cells.type)) : undefined
    if (!cells.type) problems.push({ row, field: 'type', message: 'enter the cutter type\'s name' })
    else if (!type) problems.push({ row, field: 'type', message: `no cutter type named "${cells.type}" in the catalogue` })
    else if (!type.active) problems.push({ row, field: 'type', message: `"${type.name}" is archived: restore it in the catalogue first` })
    const result = CutterRow.safeParse({
      diameterMm: cells.diameter_mm ? number(cells.diameter_mm) : type?.cuttingDiameterMm ?? 1,
      status: cells.status ? normaliseWord(cells.status) : 'in_crib',
      regrindCount: cells.regrind_count ? number(cells.regrind_count) : 0,
      lifeUsed: !cells.life_used_percent ? 0 : parsePercent(cells.life_used_percent) ?? cells.life_used_percent,
      note: cells.note ?? '',
    })
    if (!result.success) {
      for (const issue of result.error.issues) {
        const field = String(issue.path[0] ?? '')
        problems.push({ row, field: CUTTER_FIELD_COLUMN[field] ?? field, message: issue.message })
      }
    } else if (type && result.data.regrindCount > type.maxRegrinds) {
      problems.push({ row, field: 'regrind_count', message: `"${type.name}" allows at most ${type.maxRegrinds} regrinds` })
    }
    return problems.length === before && type && result.success ? { ...result.data, typeId: type.id } : undefined
  })
}
