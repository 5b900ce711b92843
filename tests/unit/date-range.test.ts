// The insights' date ranges are whole days of the shop, both ends included: each day runs from
// the shop's local midnight to the next, in its IANA time zone.
import { describe, expect, it } from 'vitest'
import { addDays, dayRange, lastDays, monthsOf, resolveRange } from '../../shared/kerf/date-range'

describe('date ranges', () => {
  it('the last 30 days end on the shop\'s today and include it', () => {
    expect(lastDays(30, 'UTC', new Date('2026-03-10T23:59:00Z'))).toEqual({ from: '2026-02-09', to: '2026-03-10' })
    // 23:59 UTC on 10 March is already 11 March in Tokyo (UTC+9), still 10 March in Chicago.
    expect(lastDays(30, 'Asia/Tokyo', new Date('2026-03-10T23:59:00Z'))).toEqual({ from: '2026-02-10', to: '2026-03-11' })
    expect(lastDays(1, 'America/Chicago', new Date('2026-03-10T23:59:00Z'))).toEqual({ from: '2026-03-10', to: '2026-03-10' })
  })

  it('a missing end is the shop\'s today, a missing start a year before the end', () => {
    const r = resolveRange({}, 'UTC', new Date('2026-12-31T12:00:00Z'))
    expect(r).toMatchObject({ from: '2026-01-01', to: '2026-12-31' })
    expect(r.start.toISOString()).toBe('2026-01-01T00:00:00.000Z')
    expect(r.end.toISOString()).toBe('2027-01-01T00:00:00.000Z')
    expect(resolveRange({ to: '2024-03-01' }, 'UTC').from).toBe('2023-03-03') // 2024 is a leap year
  })

  it('a day runs from local midnight to local midnight, 23 hours on the day the clocks go forward', () => {
    // IANA tz database: America/Chicago is UTC-6 (CST) until 02:00 on 8 March 2026, then UTC-5
    // (CDT); Europe/London goes from UTC+0 to UTC+1 at 01:00 on 29 March 2026; Asia/Tokyo is UTC+9.
    const chicago = dayRange('2026-03-08', '2026-03-08', 'America/Chicago')
    expect(chicago.start.toISOString()).toBe('2026-03-08T06:00:00.000Z')
    expect(chicago.end.toISOString()).toBe('2026-03-09T05:00:00.000Z')
    const london = dayRange('2026-03-29', '2026-10-25', 'Europe/London')
    expect(london.start.toISOString()).toBe('2026-03-29T00:00:00.000Z')
    // 25 October 2026 has 25 hours in London: it ends at midnight GMT.
    expect(london.end.toISOString()).toBe('2026-10-26T00:00:00.000Z')
    const tokyo = dayRange('2026-07-01', '2026-07-01', 'Asia/Tokyo')
    expect(tokyo.start.toISOString()).toBe('2026-06-30T15:00:00.000Z')
    expect(tokyo.end.getTime() - tokyo.start.getTime()).toBe(24 * 3_600_000)
  })

  it('a range at the end of the calendar still has a valid end (the fuzz found one that had none)', () => {
    expect(dayRange('9999-12-31', '9999-12-31', 'UTC').end.toISOString()).toBe('+010000-01-01T00:00:00.000Z')
  })

  it('adds calendar days across month and year ends', () => {
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01')
    expect(addDays('2024-03-01', -1)).toBe('2024-02-29')
  })

  it('lists every month the range touches', () => {
    expect(monthsOf({ from: '2025-11-20', to: '2026-02-01' })).toEqual(['2025-11', '2025-12', '2026-01', '2026-02'])
    expect(monthsOf({ from: '2026-05-01', to: '2026-05-31' })).toEqual(['2026-05'])
  })
})
