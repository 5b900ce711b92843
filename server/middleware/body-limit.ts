// Refuses a write whose body is larger than any form of ours sends, before it is read: a JSON
// body is parsed whole, so without this one request could hold megabytes of the server's memory.
// The CSV imports and the flag photo have larger limits of their own (server/utils/platform/csv-import.ts,
// server/utils/platform/uploads.ts).
export const JSON_BODY_MAX_BYTES = 256 * 1024

const OWN_LIMIT = [/^\/api\/import\//, /^\/api\/cutters\/[^/]+\/flag$/]

export default defineEventHandler((event) => {
  if (event.method === 'GET' || event.method === 'HEAD' || !event.path.startsWith('/api/')) return
  const path = event.path.split('?')[0]!
  if (OWN_LIMIT.some((re) => re.test(path))) return
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (length > JSON_BODY_MAX_BYTES) {
    throw createError({ statusCode: 413, statusMessage: `The request is too large: at most ${JSON_BODY_MAX_BYTES / 1024} KB.` })
  }
})
