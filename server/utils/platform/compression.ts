// Which responses are worth compressing and with what: the choices of server/plugins/compression.ts,
// kept pure so that they are tested on their own.

/** Below this a response fits in a packet or two anyway; compressing it costs more than it saves. */
export const COMPRESS_FROM_BYTES = 1024

/** Text formats compress well; images, PDFs and archives are compressed already. */
export function isCompressibleType(contentType: string | undefined): boolean {
  if (!contentType) return false
  const type = contentType.split(';')[0]!.trim().toLowerCase()
  return type.startsWith('text/') || type === 'application/json' || type.endsWith('+json') || type === 'application/javascript'
    || type === 'image/svg+xml' || type === 'application/manifest+json'
}

/**
 * The encoding to answer with for an Accept-Encoding header (RFC 9110, 12.5.3): brotli where it is
 * accepted, else gzip; `q=0` refuses one; none when neither is accepted.
 */
export function chooseEncoding(acceptEncoding: string | undefined): 'br' | 'gzip' | null {
  if (!acceptEncoding) return null
  const accepted = new Map<string, number>()
  for (const part of acceptEncoding.split(',')) {
    const [name, ...params] = part.trim().toLowerCase().split(';')
    if (!name) continue
    const q = params.map((p) => p.trim()).find((p) => p.startsWith('q='))
    const weight = q ? Number(q.slice(2)) : 1
    accepted.set(name, Number.isFinite(weight) ? weight : 0)
  }
  const weightOf = (name: string) => accepted.get(name) ?? (accepted.has('*') ? accepted.get('*')! : 0)
  const br = weightOf('br')
  const gz = weightOf('gzip')
  if (br <= 0 && gz <= 0) return null
  return br >= gz && br > 0 ? 'br' : 'gzip'
}
