// When a shop's morning tooling report is due: at its report time in its own time zone, once
// per local calendar day. Pure (date-fns with the @date-fns/tz named-zone helper).
import { tz } from '@date-fns/tz'
import { format } from 'date-fns'

/** The shop's local calendar day and clock time at `now`. */
export function localClock(now: Date, timeZone: string): { date: string, time: string } {
  const inZone = { in: tz(timeZone) }
  return { date: format(now, 'yyyy-MM-dd', inZone), time: format(now, 'HH:mm', inZone) }
}

/**
 * The local day whose report is due at `now`, or null before the report time. A report time
 * that a daylight-saving change skips (02:30 on a spring-forward night) falls due at the first
 * local time after it; a repeated hour cannot make it due twice because the day is the key.
 */
export function reportDueDay(now: Date, timeZone: string, reportTime: string): string | null {
  const { date, time } = localClock(now, timeZone)
  return time >= reportTime.slice(0, 5) ? date : null
}

export function isValidTimeZone(timeZone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone })
    return true
  } catch {
    return false
  }
}
