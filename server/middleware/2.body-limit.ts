// Reads every write body under a limit, counting bytes as they arrive, whatever the headers say:
// a JSON body is parsed whole, so without this one request (chunked, or with a Content-Length
// that lies low) could hold megabytes of the server's memory. The body read here is what the
// route's readBody / readMultipartFormData then see. The CSV imports and the flag photo have
// larger limits; a new upload route belongs in LIMITS.
import type { H3Event } from 'h3'
import { IMPORT_MAX_BYTES } from '#shared/schemas/crib'
import { PHOTO_MAX_BYTES } from '#shared/schemas/spindle'

export const JSON_BODY_MAX_BYTES = 256 * 1024

const LIMITS: Array<{ path: RegExp, bytes: number, what: string }> = [
  // JSON escapes quotes and line breaks, so the body may be somewhat larger than the CSV inside it.
  { path: /^\/api\/import\//, bytes: IMPORT_MAX_BYTES * 1.5, what: 'The CSV is too large: at most 2 MB. Split it into smaller files.' },
  // The photo, plus room for the form's other fields and boundaries.
  { path: /^\/api\/cutters\/[^/]+\/flag$/, bytes: PHOTO_MAX_BYTES + 64 * 1024, what: `The photo is too large: at most ${Math.round(PHOTO_MAX_BYTES / 1024 / 1024)} MB.` },
]

// Past the limit, the rest of a body is read and dropped as it arrives rather than the connection
// closed at once: a client still sending when its connection is reset never sees the 413 (the
// reset throws away the answer waiting in its buffers). Beyond this much more, the connection is cut.
const DISCARD_MAX_BYTES = 32 * 1024 * 1024

function tooLarge(message: string) {
  return createError({ statusCode: 413, statusMessage: message })
}

/** The body, kept until its end or until it passes the limit (then 413, and the rest is dropped). */
function readUnder(event: H3Event, limit: number, message: string): Promise<Buffer> {
  const req = event.node.req
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    const done = () => {
      req.off('data', onData).off('end', onEnd).off('error', onError)
    }
    const onData = (chunk: Buffer) => {
      size += chunk.length
      if (size > limit) {
        done()
        let dropped = 0
        req.on('data', (more: Buffer) => {
          dropped += more.length
          if (dropped > DISCARD_MAX_BYTES) req.destroy()
        })
        reject(tooLarge(message))
      } else {
        chunks.push(chunk)
      }
    }
    const onEnd = () => {
      done()
      resolve(Buffer.concat(chunks, size))
    }
    const onError = (err: Error) => {
      done()
      reject(err)
    }
    req.on('data', onData).on('end', onEnd).on('error', onError)
  })
}

// Routes that read their body as a stream themselves, counting as it arrives under their own
// limit: the NC program upload (server/utils/spindle/programs.ts).
const STREAMED = [/^\/api\/programs$/]

export default defineEventHandler(async (event) => {
  if (event.method === 'GET' || event.method === 'HEAD' || !event.path.startsWith('/api/') || !requestHasBody(event)) return
  const path = event.path.split('?')[0]!
  if (STREAMED.some((re) => re.test(path))) return
  const own = LIMITS.find((l) => l.path.test(path))
  const limit = own?.bytes ?? JSON_BODY_MAX_BYTES
  const message = own?.what ?? `The request is too large: at most ${JSON_BODY_MAX_BYTES / 1024} KB.`
  if (Number(getRequestHeader(event, 'content-length') ?? 0) > limit) throw tooLarge(message)
  // h3's body readers take a body already read from here.
  event._requestBody = (await readUnder(event, limit, message)) as Uint8Array<ArrayBuffer>
})
