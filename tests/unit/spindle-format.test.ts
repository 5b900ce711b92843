// How the spindle pages write lengths, feeds and durations. 1 in = 25.4 mm exactly (the
// international inch of 1959, NIST Handbook 44 Appendix C).
import { describe, expect, it } from 'vitest'
import { formatFeed, formatLength } from '../../shared/kerf/units'
import { formatElapsed, formatLoggedMinutes, formatMinutes, formatTotalTime, timerMinutes } from '../../utils/durations'

describe('lengths and feeds', () => {
  it('shows a quarter-inch bit as 6.35 mm or 0.250 in, as the reader prefers', () => {
    expect(formatLength(6.35, 'mm')).toBe('6.35 mm')
    expect(formatLength(6.35, 'in')).toBe('0.250 in')
    expect(formatLength(3.175, 'mm')).toBe('3.175 mm')
    expect(formatLength(12, 'mm')).toBe('12 mm')
  })

  it('turns a feed in mm/min into inches per minute', () => {
    expect(formatFeed(2540, 'in')).toBe('100.0 in/min')
    expect(formatFeed(2000, 'in')).toBe('78.7 in/min')
    expect(formatFeed(2000, 'mm')).toBe('2000 mm/min')
  })
})

describe('durations', () => {
  it('rounds estimates to whole minutes and writes long ones in hours', () => {
    expect(formatMinutes(44.6)).toBe('45 min')
    expect(formatMinutes(60)).toBe('1 h')
    expect(formatMinutes(312.4)).toBe('5 h 12 min')
    expect(formatMinutes(-3)).toBe('0 min')
  })

  it('writes a cutter\'s total cutting time in whole hours once past an hour', () => {
    expect(formatTotalTime(45)).toBe('45 min')
    expect(formatTotalTime(2638)).toBe('44 h')
    expect(formatTotalTime(123_456)).toBe('2,058 h')
  })

  it('writes logged minutes as typed, without a trailing .0', () => {
    expect(formatLoggedMinutes(15)).toBe('15 min')
    expect(formatLoggedMinutes(12.5)).toBe('12.5 min')
  })

  it('fills the minutes from a timer to a tenth, never zero', () => {
    expect(timerMinutes(12 * 60_000 + 31_000)).toBe(12.5)
    expect(timerMinutes(2_000)).toBe(0.1)
    expect(formatElapsed(247_000)).toBe('4:07')
    expect(formatElapsed(3_750_000)).toBe('1:02:30')
  })
})
