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
  const unknown: string[] = []
  columns.forEach((c) => {
    if (!c) problems.push({ row: headerIndex + 1, field: '', message: 'a column has no name in the header row' })
    else if (!known.includes(c)) unknown.push(c)
    else if (seen.has(c)) problems.push({ row: headerIndex + 1, field: c, message: 'this column appears twice' })
    seen.add(c)
  })
  // One problem for every unknown column, naming the known ones once: the answer stays in
  // proportion to the file, however many columns it has.
  if (unknown.length) {
    problems.unshift({
      row: headerIndex + 1,
      field: unknown.length === 1 ? unknown[0]! : '',
      message: `unknown column${unknown.length === 1 ? '' : 's'} ${unknown.slice(0, 10).map((c) => `"${c.slice(0, 40)}"`).join(', ')}${
        unknown.length > 10 ? ` and ${unknown.length - 10} more` : ''}; the columns are ${known.join(', ')}`,
    })
  }
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
 * leading apostrophe (OWASP "CSV injection"). So does every such start after a separator some
 * spreadsheet splits on (comma, semicolon in many European locales, tab, pipe, a line break):
 * opened with another separator than ours, "a;=1+1" becomes two cells, the second a formula.
 * Ours rather than papaparse's escapeFormulae, whose pattern misses a formula after a line break.
 */
export function neutraliseCell(value: unknown): string | number {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return value
  return String(value).replace(/(^|[,;\t|\r\n])([ "]*)(?=[=+\-@\t\r])/g, (_, sep: string, lead: string) => `${sep}${lead}'`)
}

/** The byte-order mark that makes spreadsheets read the file as UTF-8 (so ° and × survive). */
export const UTF8_BOM = '\uFEFF'

/** CSV text of a header and rows, every text cell neutralised, with a byte-order mark first. */
export function toCsv(columns: readonly string[], rows: ReadonlyArray<ReadonlyArray<unknown>>): string {
  return UTF8_BOM + Papa.unparse({ fields: [...columns], data: rows.map((r) => r.map(neutraliseCell)) }, { newline: '\r\n' })
}
