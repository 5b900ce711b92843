// The cut form asks before logging minutes far from usual: more than the shop's shift (12 hours
// unless the shop sets another), or more than four times the longest cut logged on the type
// (common practice: a thumb that types 600 for 60 should not use up a bit's life in one log).
import { describe, expect, it } from 'vitest'
import { unusualMinutes } from '../../shared/kerf/spindle'

describe('minutes far from usual', () => {
  const usual = { shiftMinutes: 720, longestCutMinutes: 45 }

  it('are more than the shift, whatever the type has seen', () => {
    expect(unusualMinutes(721, { shiftMinutes: 720, longestCutMinutes: 600 })).toBe('That is longer than the shop\'s shift of 12 h.')
    expect(unusualMinutes(720, { shiftMinutes: 720, longestCutMinutes: 600 })).toBeNull()
    expect(unusualMinutes(500, { shiftMinutes: 480, longestCutMinutes: null })).toBe('That is longer than the shop\'s shift of 8 h.')
  })

  it('or more than four times the type\'s longest logged cut', () => {
    expect(unusualMinutes(180, usual)).toBeNull()
    expect(unusualMinutes(180.5, usual)).toMatch(/more than 4 times the longest cut logged on this type of bit \(45 min\)/)
    expect(unusualMinutes(600, usual)).not.toBeNull()
  })

  it('are never unusual against a type with no cuts yet, below the shift', () => {
    expect(unusualMinutes(600, { shiftMinutes: 720, longestCutMinutes: null })).toBeNull()
    expect(unusualMinutes(600, { shiftMinutes: 720, longestCutMinutes: 0 })).toBeNull()
  })
})
