// Which encoding the server answers with, read from Accept-Encoding as RFC 9110 (section 12.5.3)
// defines it: q-values weigh the codings, q=0 refuses one, "*" stands for any not named.
import { describe, expect, it } from 'vitest'
import { chooseEncoding, isCompressibleType } from '../../server/utils/platform/compression'

describe('the response encoding', () => {
  it('prefers brotli, then gzip, as browsers offer them', () => {
    expect(chooseEncoding('gzip, deflate, br, zstd')).toBe('br')
    expect(chooseEncoding('gzip, deflate')).toBe('gzip')
    expect(chooseEncoding('deflate')).toBeNull()
    expect(chooseEncoding(undefined)).toBeNull()
    expect(chooseEncoding('identity')).toBeNull()
  })

  it('honours q-values: q=0 refuses, a higher q wins', () => {
    expect(chooseEncoding('br;q=0, gzip')).toBe('gzip')
    expect(chooseEncoding('gzip;q=1.0, br;q=0.5')).toBe('gzip')
    expect(chooseEncoding('gzip;q=0, br;q=0')).toBeNull()
    expect(chooseEncoding('*')).toBe('br')
    expect(chooseEncoding('*;q=0.5, br;q=0')).toBe('gzip')
  })

  it('compresses text and JSON, not images', () => {
    expect(isCompressibleType('text/html;charset=utf-8')).toBe(true)
    expect(isCompressibleType('application/json')).toBe(true)
    expect(isCompressibleType('text/csv; charset=utf-8')).toBe(true)
    expect(isCompressibleType('image/png')).toBe(false)
    expect(isCompressibleType(undefined)).toBe(false)
  })
})
