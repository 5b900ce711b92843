// The morning report falls due at the shop's own local time, across daylight-saving changes.
// Dates of the changes: US rules (second Sunday of March, first Sunday of November) and EU
// rules (last Sunday of March and October), from memory; the assertions check the offsets too.
import { describe, expect, it } from 'vitest'
import { isValidTimeZone, localClock, reportDueDay } from '../../shared/kerf/report-schedule'

describe('the shop\'s local clock', () => {
  it('New York is UTC−5 in winter and UTC−4 in summer', () => {
    expect(localClock(new Date('2026-01-15T10:30:00Z'), 'America/New_York')).toEqual({ date: '2026-01-15', time: '05:30' })
    expect(localClock(new Date('2026-07-15T09:30:00Z'), 'America/New_York')).toEqual({ date: '2026-07-15', time: '05:30' })
  })

  it('the local day can differ from the UTC day', () => {
    expect(localClock(new Date('2026-06-01T22:00:00Z'), 'Pacific/Auckland').date).toBe('2026-06-02')
  })
})

describe('report due', () => {
  it('is not due before the report time and due from it on, in the shop\'s zone', () => {
    expect(reportDueDay(new Date('2026-01-15T10:29:00Z'), 'America/New_York', '05:30')).toBeNull()
    expect(reportDueDay(new Date('2026-01-15T10:30:00Z'), 'America/New_York', '05:30')).toBe('2026-01-15')
    expect(reportDueDay(new Date('2026-01-15T10:30:00Z'), 'UTC', '05:30')).toBe('2026-01-15')
  })

  it('after spring forward the same 05:30 local comes an hour earlier in UTC', () => {
    // 2026-03-08: New York moves from UTC−5 to UTC−4.
    expect(reportDueDay(new Date('2026-03-08T09:29:00Z'), 'America/New_York', '05:30')).toBeNull()
    expect(reportDueDay(new Date('2026-03-08T09:30:00Z'), 'America/New_York', '05:30')).toBe('2026-03-08')
    // The day before, 09:30 UTC was still 04:30 local.
    expect(reportDueDay(new Date('2026-03-07T09:30:00Z'), 'America/New_York', '05:30')).toBeNull()
  })

  it('a report time skipped by spring forward falls due at the first local time after it', () => {
    // 02:00 → 03:00 local on 2026-03-08: 02:30 never happens. 06:59 UTC is 01:59 EST; 07:00 UTC is 03:00 EDT.
    expect(reportDueDay(new Date('2026-03-08T06:59:00Z'), 'America/New_York', '02:30')).toBeNull()
    expect(reportDueDay(new Date('2026-03-08T07:00:00Z'), 'America/New_York', '02:30')).toBe('2026-03-08')
  })

  it('the hour repeated by fall back gives the same day, so the day key stops a second report', () => {
    // 2026-11-01: 01:30 local happens at 05:30 UTC (EDT) and again at 06:30 UTC (EST).
    const first = reportDueDay(new Date('2026-11-01T05:30:00Z'), 'America/New_York', '01:30')
    const second = reportDueDay(new Date('2026-11-01T06:30:00Z'), 'America/New_York', '01:30')
    expect(first).toBe('2026-11-01')
    expect(second).toBe(first)
  })

  it('Europe changes on its own dates', () => {
    // 2026-03-29: Berlin moves from UTC+1 to UTC+2.
    expect(reportDueDay(new Date('2026-03-28T04:30:00Z'), 'Europe/Berlin', '05:30')).toBe('2026-03-28')
    expect(reportDueDay(new Date('2026-03-29T03:29:00Z'), 'Europe/Berlin', '05:30')).toBeNull()
    expect(reportDueDay(new Date('2026-03-29T03:30:00Z'), 'Europe/Berlin', '05:30')).toBe('2026-03-29')
  })

  it('knows a time zone name from a typo', () => {
    expect(isValidTimeZone('America/Chicago')).toBe(true)
    expect(isValidTimeZone('America/Chicgo')).toBe(false)
  })
})
