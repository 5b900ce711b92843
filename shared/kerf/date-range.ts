// The insights' date ranges: whole UTC days, both ends included, as 'YYYY-MM-DD'. Pure.
import { addHours, parseISO, subHours } from 'date-fns'

// Whole UTC days as hours: date-fns' addDays follows the local clock across daylight saving.
const DAY_HOURS = 24
export const DEFAULT_RANGE_DAYS = 365
export const RANGE_PRESETS = [30, 90, 365] as const

export interface DateRange {
  from: string
  to: string
  /** First instant of `from` and first instant after `to`, for timestamp comparisons. */
  start: Date
  end: Date
}

const day = (d: Date) => d.toISOString().slice(0, 10)

/** The last `days` days up to and including `today` (UTC). */
export function lastDays(days: number, today: Date = new Date()): { from: string, to: string } {
  const to = day(today)
  return { from: day(subHours(parseISO(`${to}T00:00:00Z`), (days - 1) * DAY_HOURS)), to }
}

/** Fills in a missing end: `to` defaults to today, `from` to a year before `to`. */
export function resolveRange(query: { from?: string, to?: string }, today: Date = new Date()): DateRange {
  const to = query.to ?? day(today)
  const from = query.from ?? lastDays(DEFAULT_RANGE_DAYS, parseISO(`${to}T00:00:00Z`)).from
  const start = parseISO(`${from}T00:00:00Z`)
  return { from, to, start, end: addHours(parseISO(`${to}T00:00:00Z`), DAY_HOURS) }
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
