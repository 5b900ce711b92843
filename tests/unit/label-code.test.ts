// Label codes are random, unambiguous when typed, and the shape the database accepts.
import { describe, expect, it } from 'vitest'
import { isLabelCode, LABEL_ALPHABET, newLabelCode, normalizeLabelCode } from '../../shared/kerf/label-code'

describe('label codes', () => {
  it('never use the characters people misread (0/O, 1/I/L)', () => {
    expect(LABEL_ALPHABET).not.toMatch(/[01OIL]/)
    const many = Array.from({ length: 2000 }, () => newLabelCode()).join('')
    expect(many).not.toMatch(/[01OIL]/)
  })

  it('are 7 characters long and match the database check', () => {
    const dbCheck = /^[2-9A-HJKMNP-Z]{4,12}$/ // the CHECK on cutters.code
    for (let i = 0; i < 200; i++) {
      const code = newLabelCode()
      expect(code).toHaveLength(7)
      expect(dbCheck.test(code)).toBe(true)
      expect(isLabelCode(code)).toBe(true)
    }
  })

  it('use every character of the alphabet about equally (no modulo bias)', () => {
    const counts = new Map<string, number>()
    const n = 31_000
    for (const ch of Array.from({ length: n / 7 + 1 }, () => newLabelCode()).join('')) counts.set(ch, (counts.get(ch) ?? 0) + 1)
    const expected = (7 * Math.ceil(n / 7)) / LABEL_ALPHABET.length
    for (const ch of LABEL_ALPHABET) expect(Math.abs(counts.get(ch)! - expected) / expected).toBeLessThan(0.15)
  })

  it('a typed code is tidied, and a code with look-alikes is refused', () => {
    expect(normalizeLabelCode(' ab-cd 234 ')).toBe('ABCD234')
    expect(isLabelCode('ABCD0O1')).toBe(false)
  })
})
