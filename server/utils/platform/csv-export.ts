// Sends CSV as a download: text/csv, an attachment with a file name, cells neutralised by toCsv.
import type { H3Event } from 'h3'
import { toCsv } from '#shared/kerf/csv'

export function sendCsv(event: H3Event, filename: string, columns: readonly string[], rows: ReadonlyArray<ReadonlyArray<unknown>>): string {
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-disposition': `attachment; filename="${filename.replace(/[^\w.-]/g, '_')}"`,
    'cache-control': 'no-store',
  })
  return toCsv(columns, rows)
}
