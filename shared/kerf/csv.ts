// CSV in and out with papaparse, the way a spreadsheet shows it: row 1 is the header, every
// record is one row (a quoted line break does not start a new one). Pure.
import Papa from 'papaparse'

/** A problem with one cell or row, as the import page and the 400 answer list it. */
export interface RowProblem { row: number, field: string, message: string }
export interface CsvRow { row: number, cells: Record<string, string> }
export interface ParsedCsv { columns: string[], rows: CsvRow[], problems: RowProblem[] }

/** "Cutting Diameter (mm)" style headers are not ours; "Cutting diameter mm" is read as cutting_diameter_mm. */
export function normaliseHeader(text: string): string {
  return text.trim().toLowerCase().replace(/[\s-]+/g, '_')
}

/** Parses CSV text with the given known and required columns; unknown or missing columns are problems on row 1. */
export function parseCsv(text: string, known: readonly string[], required: readonly string[]): ParsedCsv {
  const problems: RowProblem[] = []
  const clean = text.replace(/^\uFEFF/, '')
  // A block pasted from a spreadsheet comes tab-separated; some locales save with semicolons.
  // Guessed on non-blank lines (blank ones would spoil the guess), then read with every line kept.
  const { delimiter } = Papa.parse<string[]>(clean, { preview: 20, skipEmptyLines: 'greedy', delimitersToGuess: [',', '\t', ';'] }).meta
  const result = Papa.parse<string[]>(clean, { skipEmptyLines: false, delimiter })
  for (const e of result.errors) {
    if (e.code === 'UndetectableDelimiter') continue
    problems.push({ row: (e.row ?? 0) + 1, field: '', message: `the CSV cannot be read here: ${e.message}` })
  }
  const records = result.data
  const headerIndex = records.findIndex((r) => r.some((c) => c.trim() !== ''))
  if (headerIndex < 0) {
    return { columns: [], rows: [], problems: [{ row: 1, field: '', message: 'the CSV is empty: the first row names the columns' }] }
  }
  const columns = records[headerIndex]!.map(normaliseHeader)
  const seen = new Set<string>()
  columns.forEach((c) => {
    if (!c) problems.push({ row: headerIndex + 1, field: '', message: 'a column has no name in the header row' })
    else if (!known.includes(c)) problems.push({ row: headerIndex + 1, field: c, message: `unknown column; the columns are ${known.join(', ')}` })
    else if (seen.has(c)) problems.push({ row: headerIndex + 1, field: c, message: 'this column appears twice' })
    seen.add(c)
  })
  for (const c of required) {
    if (!seen.has(c)) problems.push({ row: headerIndex + 1, field: c, message: 'this column is missing from the header row' })
  }

  const rows: CsvRow[] = []
  records.slice(headerIndex + 1).forEach((record, i) => {
    if (record.every((c) => c.trim() === '')) return
    const row = headerIndex + 2 + i
    if (record.slice(columns.length).some((c) => c.trim() !== '')) {
      problems.push({ row, field: '', message: `this row has ${record.length} cells but the header names ${columns.length} columns` })
    }
    const cells: Record<string, string> = {}
    columns.forEach((c, j) => { if (c) cells[c] = (record[j] ?? '').trim() })
    rows.push({ row, cells })
  })
  return { columns, rows, problems }
}

/**
 * A cell a spreadsheet could run as a formula (= + - @, or a tab or carriage return first) gets a
 * leading apostrophe (OWASP "CSV injection"). Ours rather than papaparse's escapeFormulae, whose
 * pattern misses a formula followed by a line break.
 */
export function neutraliseCell(value: unknown): string | number {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return value
  const s = String(value)
  return /^[=+\-@\t\r]/.test(s) ? `'${s}` : s
}

/** CSV text of a header and rows, every text cell neutralised. */
export function toCsv(columns: readonly string[], rows: ReadonlyArray<ReadonlyArray<unknown>>): string {
  return Papa.unparse({ fields: [...columns], data: rows.map((r) => r.map(neutraliseCell)) }, { newline: '\r\n' })
}
