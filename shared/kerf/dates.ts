// Dates and times as people read them: in their own language's order (the locale) and on the
// shop's clock (its IANA time zone), through Intl so the browser, the server, the PDF and the
// mail all word a moment the same way. A calendar day ('YYYY-MM-DD', a report day, a roll-up
// day) is already the shop's day and is shown as it is, with no zone to convert. Pure.

export interface DateStyle {
  /** BCP 47 tag, e.g. 'en-GB'. */
  locale: string
  /** IANA time zone name, e.g. 'America/Chicago'. */
  timeZone: string
}

/** The locale used where nobody's language is known (server-made PDFs and mail). */
export const FALLBACK_LOCALE = 'en-GB'

const formats = new Map<string, Intl.DateTimeFormat>()
function formatter(style: DateStyle, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${style.locale}|${style.timeZone}|${JSON.stringify(options)}`
  let f = formats.get(key)
  if (!f) {
    f = new Intl.DateTimeFormat(style.locale, { ...options, timeZone: style.timeZone })
    formats.set(key, f)
  }
  return f
}

const DATE = { day: 'numeric', month: 'short', year: 'numeric' } as const
const TIME = { hour: 'numeric', minute: '2-digit' } as const
const toDate = (at: string | Date) => (typeof at === 'string' ? new Date(at) : at)

/** "3 Dec 2026" (en-GB), "Dec 3, 2026" (en-US): the shop's day of the moment. */
export function showDate(at: string | Date, style: DateStyle): string {
  return formatter(style, DATE).format(toDate(at))
}

/** "3 Dec 2026, 14:05" (en-GB), "Dec 3, 2026, 2:05 PM" (en-US), on the shop's clock. */
export function showDateTime(at: string | Date, style: DateStyle): string {
  return formatter(style, { ...DATE, ...TIME }).format(toDate(at))
}

/** "Thu 3 Dec, 14:05": a recent moment, where the year goes without saying. */
export function showShortDateTime(at: string | Date, style: DateStyle): string {
  return formatter(style, { weekday: 'short', day: 'numeric', month: 'short', ...TIME }).format(toDate(at))
}

/** "14:05" (en-GB), "2:05 PM" (en-US), on the shop's clock. */
export function showTime(at: string | Date, style: DateStyle): string {
  return formatter(style, TIME).format(toDate(at))
}

/** A calendar day 'YYYY-MM-DD' (already the shop's day) in the reader's order: "3 Dec 2026". */
export function showDay(day: string, locale: string): string {
  // Noon UTC of that date, worded in UTC, is that date whatever the locale.
  return formatter({ locale, timeZone: 'UTC' }, DATE).format(new Date(`${day.slice(0, 10)}T12:00:00Z`))
}

/** The shop's calendar date of a moment as numbers (month 1 to 12), read through Intl. */
function shopDate(at: string | Date, timeZone: string): { y: number, m: number, d: number } {
  const parts = formatter({ locale: 'en-US', timeZone }, { year: 'numeric', month: 'numeric', day: 'numeric', era: 'short' })
    .formatToParts(toDate(at))
  const part = (type: Intl.DateTimeFormatPartTypes) => Number(parts.find((p) => p.type === type)?.value)
  const year = part('year')
  return { y: parts.find((p) => p.type === 'era')?.value === 'BC' ? 1 - year : year, m: part('month'), d: part('day') }
}

/** The shop's calendar day of a moment, 'YYYY-MM-DD'. */
export function shopDay(at: string | Date, timeZone: string): string {
  const { y, m, d } = shopDate(at, timeZone)
  return `${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`
}

/** The shop's calendar day of a moment as a day number (days since 1970-01-01), for counting days. */
export function shopDayNumber(at: Date, timeZone: string): number {
  const { y, m, d } = shopDate(at, timeZone)
  return Math.round(Date.UTC(y, m - 1, d) / 86_400_000)
}

const ages = new Map<string, Intl.RelativeTimeFormat>()
/** How long ago, in words of the locale: "5 minutes ago", "3 hours ago", "2 days ago", "now". */
export function showAge(at: string | Date, now: Date, locale: string): string {
  let f = ages.get(locale)
  if (!f) {
    f = new Intl.RelativeTimeFormat(locale, { numeric: 'auto' })
    ages.set(locale, f)
  }
  const minutes = Math.max(0, Math.floor((now.getTime() - toDate(at).getTime()) / 60_000))
  if (minutes < 60) return f.format(-minutes, 'minute')
  const hours = Math.floor(minutes / 60)
  if (hours < 48) return f.format(-hours, 'hour')
  return f.format(-Math.floor(hours / 24), 'day')
}

/**
 * The first language of an Accept-Language header that Intl can word dates in, else the
 * fallback: "en-US,en;q=0.9" gives 'en-US'. Weights are honoured; '*' is skipped.
 */
export function pickLocale(acceptLanguage: string | null | undefined, fallback = FALLBACK_LOCALE): string {
  const tags = (acceptLanguage ?? '').split(',')
    .map((part, i) => {
      const [tag = '', ...params] = part.trim().split(';')
      const q = params.map((p) => p.trim()).find((p) => p.startsWith('q='))
      return { tag: tag.trim(), q: q ? Number(q.slice(2)) : 1, i }
    })
    .filter((t) => t.tag && t.tag !== '*' && t.q > 0 && /^[A-Za-z]{2,8}(-[A-Za-z0-9]{1,8})*$/.test(t.tag))
    .sort((a, b) => b.q - a.q || a.i - b.i)
  for (const { tag } of tags) {
    try {
      const [supported] = Intl.DateTimeFormat.supportedLocalesOf(tag)
      if (supported) return supported
    } catch {
      // A malformed tag is skipped like an unsupported one.
      continue
    }
  }
  return fallback
}
