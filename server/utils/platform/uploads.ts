// Uploaded files: checked by their content (not their name), size-limited, stored under random
// names in the 'uploads' store, and recorded with their shop.
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import type { Queryable } from '../../db/connect'

const IMAGE_SIGNATURES: Array<{ type: string, ext: string, test: (b: Buffer) => boolean }> = [
  { type: 'image/jpeg', ext: 'jpg', test: (b) => b.length > 3 && b[0] === 0xFF && b[1] === 0xD8 && b[2] === 0xFF },
  { type: 'image/png', ext: 'png', test: (b) => b.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A])) },
  { type: 'image/webp', ext: 'webp', test: (b) => b.subarray(0, 4).toString('latin1') === 'RIFF' && b.subarray(8, 12).toString('latin1') === 'WEBP' },
  // Phones save HEIC/HEIF: an ISO-BMFF 'ftyp' box with a HEIF brand.
  { type: 'image/heic', ext: 'heic', test: (b) => b.subarray(4, 8).toString('latin1') === 'ftyp' && /^(heic|heix|mif1|msf1|heif)$/.test(b.subarray(8, 12).toString('latin1')) },
]

/** The image type read from the first bytes, or undefined when it is not a photo we accept. */
export function sniffImage(data: Buffer): { type: string, ext: string } | undefined {
  return IMAGE_SIGNATURES.find((s) => s.test(data))
}

/** Refuses a request body over the limit before reading it. */
export function assertBodySize(event: H3Event, maxBytes: number, what: string): void {
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (length > maxBytes + 64 * 1024) {
    throw createError({ statusCode: 413, statusMessage: `The ${what} is too large: at most ${Math.round(maxBytes / 1024 / 1024)} MB.` })
  }
}

export async function storePhoto(db: Queryable, opts: { shopId: number, userId: number, data: Buffer, filename?: string, maxBytes: number }) {
  if (opts.data.length === 0) {
    throw createError({ statusCode: 400, statusMessage: 'photo: the file is empty', data: { fields: { photo: 'the file is empty' } } })
  }
  if (opts.data.length > opts.maxBytes) {
    throw createError({ statusCode: 413, statusMessage: `The photo is too large: at most ${Math.round(opts.maxBytes / 1024 / 1024)} MB.` })
  }
  const kind = sniffImage(opts.data)
  if (!kind) {
    throw createError({ statusCode: 415, statusMessage: 'photo: not a JPEG, PNG, WebP or HEIC image', data: { fields: { photo: 'not a JPEG, PNG, WebP or HEIC image' } } })
  }
  const key = `photos/${opts.shopId}/${randomBytes(16).toString('hex')}.${kind.ext}`
  await useStorage('uploads').setItemRaw(key, opts.data)
  return db.insertInto('uploads').values({
    shop_id: opts.shopId, storage_key: key, kind: 'photo', content_type: kind.type, size_bytes: opts.data.length,
    original_name: opts.filename?.slice(0, 200) ?? null, uploaded_by: opts.userId,
  }).returning(['id', 'storage_key']).executeTakeFirstOrThrow()
}
