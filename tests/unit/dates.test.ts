// Dates and times are worded in the reader's locale and on the shop's clock. The expected words
// are the Unicode CLDR's date patterns for each locale (as ICU in Node and the browsers carries
// them: "3 Dec 2026" in en-GB, "Dec 3, 2026" in en-US), and the clock times follow the IANA tz
// database's offsets for each zone (Asia/Tokyo UTC+9 all year; America/Chicago UTC-6 in winter,
// UTC-5 from 8 March 2026).
import { describe, expect, it } from 'vitest'
import { pickLocale, shopDay, shopDayNumber, showAge, showDate, showDateTime, showDay, showShortDateTime, showTime } from '../../shared/kerf/dates'

// 14:05 UTC on Thursday 3 December 2026: 23:05 the same day in Tokyo, 08:05 in Chicago.
const AT = '2026-12-03T14:05:00Z'
// 02:30 UTC on Friday 4 December: still Thursday evening in Chicago (20:30), Friday in Tokyo.
const LATE = '2026-12-04T02:30:00Z'

describe('a moment in the reader\'s words, on the shop\'s clock', () => {
  it('orders day and month as the locale does', () => {
    expect(showDate(AT, { locale: 'en-GB', timeZone: 'UTC' })).toBe('3 Dec 2026')
    expect(showDate(AT, { locale: 'en-US', timeZone: 'UTC' })).toBe('Dec 3, 2026')
    expect(showDate(AT, { locale: 'de-DE', timeZone: 'UTC' })).toBe('3. Dez. 2026')
  })

  it('gives the day and time of the shop\'s zone, east and west of UTC', () => {
    expect(showDateTime(AT, { locale: 'en-GB', timeZone: 'Asia/Tokyo' })).toBe('3 Dec 2026, 23:05')
    expect(showDateTime(AT, { locale: 'en-US', timeZone: 'America/Chicago' })).toBe('Dec 3, 2026, 8:05 AM')
    expect(showDate(LATE, { locale: 'en-GB', timeZone: 'America/Chicago' })).toBe('3 Dec 2026')
    expect(showDate(LATE, { locale: 'en-GB', timeZone: 'Asia/Tokyo' })).toBe('4 Dec 2026')
    expect(showTime(LATE, { locale: 'en-GB', timeZone: 'America/Chicago' })).toBe('20:30')
    expect(showTime(LATE, { locale: 'en-US', timeZone: 'Asia/Tokyo' })).toBe('11:30 AM')
    expect(showShortDateTime(LATE, { locale: 'en-GB', timeZone: 'America/Chicago' })).toBe('Thu 3 Dec, 20:30')
  })

  it('follows the zone across a daylight-saving change', () => {
    // 12:00 UTC is 06:00 CST on 7 March 2026 and 07:00 CDT on 9 March (en-GB writes the hour without a leading zero).
    expect(showTime('2026-03-07T12:00:00Z', { locale: 'en-GB', timeZone: 'America/Chicago' })).toBe('6:00')
    expect(showTime('2026-03-09T12:00:00Z', { locale: 'en-GB', timeZone: 'America/Chicago' })).toBe('7:00')
  })

  it('shows a calendar day as it is, whatever the zone of the machine', () => {
    expect(showDay('2026-12-03', 'en-GB')).toBe('3 Dec 2026')
    expect(showDay('2026-12-03', 'en-US')).toBe('Dec 3, 2026')
    expect(showDay('2026-01-01', 'en-US')).toBe('Jan 1, 2026')
  })

  it('knows the shop\'s day of a moment, as a date and as a day number', () => {
    expect(shopDay(LATE, 'America/Chicago')).toBe('2026-12-03')
    expect(shopDay(LATE, 'Asia/Tokyo')).toBe('2026-12-04')
    expect(shopDay('2026-03-09T04:59:00Z', 'America/Chicago')).toBe('2026-03-08')
    expect(shopDay('2026-03-09T05:01:00Z', 'America/Chicago')).toBe('2026-03-09')
    const n = (day: string) => Date.parse(`${day}T00:00:00Z`) / 86_400_000
    expect(shopDayNumber(new Date(LATE), 'America/Chicago')).toBe(n('2026-12-03'))
    expect(shopDayNumber(new Date(LATE), 'Asia/Tokyo')).toBe(n('2026-12-04'))
  })

  it('says how long ago in the locale\'s words', () => {
    const now = new Date('2026-12-03T10:00:00Z')
    expect(showAge('2026-12-03T09:59:30Z', now, 'en')).toBe('this minute')
    expect(showAge('2026-12-03T09:55:00Z', now, 'en')).toBe('5 minutes ago')
    expect(showAge('2026-12-03T07:00:00Z', now, 'en')).toBe('3 hours ago')
    expect(showAge('2026-11-30T10:00:00Z', now, 'en')).toBe('3 days ago')
    expect(showAge('2026-12-03T09:55:00Z', now, 'de')).toBe('vor 5 Minuten')
  })
})

describe('the reader\'s locale from the Accept-Language header', () => {
  it('takes the first language by weight that dates can be worded in', () => {
    expect(pickLocale('en-US,en;q=0.9')).toBe('en-US')
    expect(pickLocale('fr;q=0.5, en-GB;q=0.8')).toBe('en-GB')
    expect(pickLocale('*, de-DE;q=0.7')).toBe('de-DE')
  })

  it('falls back to en-GB for nothing, nonsense or a language no locale data covers', () => {
    expect(pickLocale(undefined)).toBe('en-GB')
    expect(pickLocale('')).toBe('en-GB')
    expect(pickLocale('<script>, ;q=1')).toBe('en-GB')
    expect(pickLocale('zz-ZZ')).toBe('en-GB')
  })
})
