// The insights' date ranges: whole days of the shop ('YYYY-MM-DD', both ends included), each
// running from the shop's local midnight to the next in its IANA time zone. Pure.
import { TZDate } from '@date-fns/tz'
import { shopDay } from './dates'

export const DEFAULT_RANGE_DAYS = 365
export const RANGE_PRESETS = [30, 90, 365] as const

export interface DateRange {
  from: string
  to: string
  /** The shop's midnight opening `from` and the one closing `to`, for timestamp comparisons. */
  start: Date
  end: Date
  /** The shop's IANA time zone the days are counted in. */
  timeZone: string
}

const parts = (day: string) => day.split('-').map(Number) as [number, number, number]

/** The calendar day `offset` days after `day` ('YYYY-MM-DD'); calendar arithmetic, no clock. */
export function addDays(day: string, offset: number): string {
  const [y, m, d] = parts(day)
  return new Date(Date.UTC(y, m - 1, d + offset)).toISOString().slice(0, 10)
}

/**
 * The first instant of a day of the shop, `offset` days after `day`: its local midnight (or the
 * first local time after it, where a daylight-saving change skips midnight).
 */
export function dayStart(day: string, timeZone: string, offset = 0): Date {
  const [y, m, d] = parts(day)
  return new Date(new TZDate(y, m - 1, d + offset, timeZone).getTime())
}

/** The shop's days from `from` to `to`, both included, as the instants they run between. */
export function dayRange(from: string, to: string, timeZone: string): DateRange {
  return { from, to, start: dayStart(from, timeZone), end: dayStart(to, timeZone, 1), timeZone }
}

/** The last `days` days of the shop up to and including its today. */
export function lastDays(days: number, timeZone: string, now: Date = new Date()): { from: string, to: string } {
  const to = shopDay(now, timeZone)
  return { from: addDays(to, -(days - 1)), to }
}

/** Fills in a missing end: `to` defaults to the shop's today, `from` to a year before `to`. */
export function resolveRange(query: { from?: string, to?: string }, timeZone: string, now: Date = new Date()): DateRange {
  const to = query.to ?? shopDay(now, timeZone)
  const from = query.from ?? addDays(to, -(DEFAULT_RANGE_DAYS - 1))
  return dayRange(from, to, timeZone)
}

/** Every month 'YYYY-MM' that the range touches, oldest first. */
export function monthsOf(range: { from: string, to: string }): string[] {
  const months: string[] = []
  let [y, m] = range.from.split('-').map(Number) as [number, number]
  const last = range.to.slice(0, 7)
  for (let guard = 0; guard < 1200; guard++) {
    const key = `${y}-${String(m).padStart(2, '0')}`
    months.push(key)
    if (key >= last) break
    if (++m > 12) { m = 1; y++ }
  }
  return months
}
