// Money as people type it ("42.50", "$1,234.5") to integer cents and back. Pure; no floating
// point on the way in, so 0.29 is 29 cents and not 28.999...
const PLAIN = /^(\d*)(?:\.(\d{0,2}))?$/
const GROUPED = /^\d{1,3}(?:,\d{3})+(?:\.\d{0,2})?$/

/** Cents from a typed amount in dollars, or undefined when it is not a plain non-negative amount. */
export function parseMoney(text: string): number | undefined {
  let s = text.trim().replace(/^\$\s*/, '')
  if (GROUPED.test(s)) s = s.replace(/,/g, '')
  const m = PLAIN.exec(s)
  if (!m || (!m[1] && !m[2])) return undefined
  const whole = m[1] ? Number(m[1]) : 0
  const cents = whole * 100 + Number((m[2] ?? '').padEnd(2, '0'))
  return Number.isSafeInteger(cents) ? cents : undefined
}

/** "42.50" from 4250: what a money field shows and what the CSV export writes. */
export function formatMoney(cents: number): string {
  const sign = cents < 0 ? '-' : ''
  const abs = Math.abs(Math.round(cents))
  return `${sign}${Math.floor(abs / 100)}.${String(abs % 100).padStart(2, '0')}`
}

/** "$42.50" for tables. */
export const showMoney = (cents: number | null | undefined) => (cents === null || cents === undefined ? '—' : `$${formatMoney(cents)}`)
