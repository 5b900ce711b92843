// Compresses the pages and JSON the server makes on each request (brotli, else gzip), as the
// browser allows. Static files are compressed once at build time instead (nitro.compressPublicAssets).
// Our own rather than h3-compression: that one compresses strings only (not the objects routes
// return as JSON), sets no Vary header and has no size floor, and a small answer (a logged cut's
// JSON) costs more CPU to compress than it saves on the wire.
import { promisify } from 'node:util'
import { brotliCompress, constants, gzip } from 'node:zlib'
import { chooseEncoding, COMPRESS_FROM_BYTES, isCompressibleType } from '../utils/platform/compression'

const brotli = promisify(brotliCompress)
const gzipAsync = promisify(gzip)

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('beforeResponse', async (event, response) => {
    const body = response.body
    if (body === null || body === undefined || event.node.res.headersSent) return
    if (getResponseHeader(event, 'content-encoding')) return
    const status = getResponseStatus(event)
    if (status === 204 || status === 304 || event.method === 'HEAD') return

    const isText = typeof body === 'string'
    if (!isText && !isPlainData(body)) return // streams, buffers (images), web responses: left as they are
    const type = (getResponseHeader(event, 'content-type') as string | undefined) ?? (isText ? 'text/html; charset=utf-8' : 'application/json')
    if (!isCompressibleType(type)) return
    appendResponseHeader(event, 'vary', 'Accept-Encoding')
    const encoding = chooseEncoding(getRequestHeader(event, 'accept-encoding'))
    if (!encoding) return
    const text = isText ? body : JSON.stringify(body)
    if (Buffer.byteLength(text) < COMPRESS_FROM_BYTES) {
      // Sent as it is; the JSON already written is kept, so the answer is not serialised twice.
      if (!isText) {
        setResponseHeader(event, 'content-type', type)
        response.body = text
      }
      return
    }

    const compressed = encoding === 'br'
      // Quality 5: most of brotli's gain at a small fraction of its top quality's CPU.
      ? await brotli(text, { params: { [constants.BROTLI_PARAM_QUALITY]: 5, [constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT } })
      : await gzipAsync(text, { level: 6 })
    setResponseHeader(event, 'content-type', type)
    setResponseHeader(event, 'content-encoding', encoding)
    response.body = compressed
  })
})

function isPlainData(value: unknown): boolean {
  if (typeof value === 'number' || typeof value === 'boolean') return true
  if (typeof value !== 'object' || value === null) return false
  if (Array.isArray(value)) return true
  const proto = Object.getPrototypeOf(value)
  return proto === Object.prototype || proto === null
}
