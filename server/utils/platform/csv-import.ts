// What both CSV imports share: the body with its 2 MB limit, the preview a dry run answers, the
// 400 that lists every bad row, and keeping the imported file with the shop's uploads.
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import type { CsvRow, RowProblem } from '#shared/kerf/csv'
import { IMPORT_MAX_BYTES, ImportBody } from '#shared/schemas/crib'
import type { Tx } from '../../db/connect'

const TOO_LARGE = 'The CSV is too large: at most 2 MB. Split it into smaller files.'

export async function readImportBody(event: H3Event) {
  // The body as sent was read under its limit already (server/middleware/2.body-limit.ts).
  const body = await readValidatedBody(event, parseWith(ImportBody))
  if (Buffer.byteLength(body.csv, 'utf8') > IMPORT_MAX_BYTES) throw createError({ statusCode: 413, statusMessage: TOO_LARGE })
  return body
}

/** A dry run's answer: the rows as read and every problem, nothing written. */
export function importPreview(columns: readonly string[], rows: CsvRow[], problems: RowProblem[]) {
  return { dryRun: true as const, ok: problems.length === 0, columns, preview: rows, errors: sortProblems(problems) }
}

// Enough to fix a file by; a file wrong everywhere answers a few kilobytes, not its own size again.
export const MAX_PROBLEMS_ANSWERED = 100

/** The problems by row, at most MAX_PROBLEMS_ANSWERED of them, the last saying how many more there are. */
function sortProblems(problems: RowProblem[]): RowProblem[] {
  const sorted = [...problems].sort((a, b) => a.row - b.row)
  if (sorted.length <= MAX_PROBLEMS_ANSWERED) return sorted
  const more = sorted.length - (MAX_PROBLEMS_ANSWERED - 1)
  return [...sorted.slice(0, MAX_PROBLEMS_ANSWERED - 1), { row: sorted[MAX_PROBLEMS_ANSWERED - 1]!.row, field: '', message: `and ${more} more problems like these: fix these first and check again` }]
}

/** 400 with data.rows naming every bad row and column; the import writes nothing. */
export function rejectImport(problems: RowProblem[]): never {
  const rows = sortProblems(problems)
  const first = rows.slice(0, 3).map((p) => `row ${p.row}${p.field ? `, ${p.field}` : ''}: ${p.message}`).join('; ')
  const more = problems.length > 3 ? ` (and ${problems.length - 3} more)` : ''
  throw createError({
    statusCode: 400,
    statusMessage: `Nothing was imported: ${problems.length === 1 ? 'one row has a problem' : `${problems.length} problems`}. ${first}${more}`
      .replace(/[^\x20-\x7E]/g, '?'),
    data: { rows },
  })
}

/** Keeps the imported file (kind 'csv') so the shop can see later what came in. */
export async function storeCsv(tx: Tx, opts: { shopId: number, userId: number, csv: string, filename?: string }) {
  const key = `imports/${opts.shopId}/${randomBytes(16).toString('hex')}.csv`
  const data = Buffer.from(opts.csv, 'utf8')
  await useStorage('uploads').setItemRaw(key, data)
  return tx.insertInto('uploads').values({
    shop_id: opts.shopId, storage_key: key, kind: 'csv', content_type: 'text/csv', size_bytes: data.length,
    original_name: opts.filename?.slice(0, 200) ?? null, uploaded_by: opts.userId,
  }).returning('id').executeTakeFirstOrThrow()
}
