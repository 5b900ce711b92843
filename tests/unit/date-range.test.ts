// The insights' date ranges are whole UTC days, both ends included.
import { describe, expect, it } from 'vitest'
import { lastDays, monthsOf, resolveRange } from '../../shared/kerf/date-range'

describe('date ranges', () => {
  it('the last 30 days end today and include it', () => {
    expect(lastDays(30, new Date('2026-03-10T23:59:00Z'))).toEqual({ from: '2026-02-09', to: '2026-03-10' })
  })

  it('a missing end is today, a missing start a year before the end', () => {
    const r = resolveRange({}, new Date('2026-12-31T12:00:00Z'))
    expect(r).toMatchObject({ from: '2026-01-01', to: '2026-12-31' })
    expect(r.start.toISOString()).toBe('2026-01-01T00:00:00.000Z')
    expect(r.end.toISOString()).toBe('2027-01-01T00:00:00.000Z')
    expect(resolveRange({ to: '2024-03-01' }).from).toBe('2023-03-03') // 2024 is a leap year
  })

  it('lists every month the range touches', () => {
    expect(monthsOf({ from: '2025-11-20', to: '2026-02-01' })).toEqual(['2025-11', '2025-12', '2026-01', '2026-02'])
    expect(monthsOf({ from: '2026-05-01', to: '2026-05-31' })).toEqual(['2026-05'])
  })
})
