// What both CSV imports share: the body with its 2 MB limit, the preview a dry run answers, the
// 400 that lists every bad row, and keeping the imported file with the shop's uploads.
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import type { CsvRow, RowProblem } from '#shared/kerf/csv'
import { IMPORT_MAX_BYTES, ImportBody } from '#shared/schemas/crib'
import type { Tx } from '../../db/connect'

const TOO_LARGE = 'The CSV is too large: at most 2 MB. Split it into smaller files.'

export async function readImportBody(event: H3Event) {
  // JSON escapes quotes and line breaks, so the body may be somewhat larger than the CSV inside it.
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (length > IMPORT_MAX_BYTES * 1.5) throw createError({ statusCode: 413, statusMessage: TOO_LARGE })
  const body = await readValidatedBody(event, parseWith(ImportBody))
  if (Buffer.byteLength(body.csv, 'utf8') > IMPORT_MAX_BYTES) throw createError({ statusCode: 413, statusMessage: TOO_LARGE })
  return body
}

/** A dry run's answer: the rows as read and every problem, nothing written. */
export function importPreview(columns: readonly string[], rows: CsvRow[], problems: RowProblem[]) {
  return { dryRun: true as const, ok: problems.length === 0, columns, preview: rows, errors: sortProblems(problems) }
}

const sortProblems = (problems: RowProblem[]) => [...problems].sort((a, b) => a.row - b.row)

/** 400 with data.rows naming every bad row and column; the import writes nothing. */
export function rejectImport(problems: RowProblem[]): never {
  const rows = sortProblems(problems)
  const first = rows.slice(0, 3).map((p) => `row ${p.row}${p.field ? `, ${p.field}` : ''}: ${p.message}`).join('; ')
  const more = rows.length > 3 ? ` (and ${rows.length - 3} more)` : ''
  throw createError({
    statusCode: 400,
    statusMessage: `Nothing was imported: ${rows.length === 1 ? 'one row has a problem' : `${rows.length} problems`}. ${first}${more}`
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
