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

/** The currencies a shop may show its money in; every one has two decimals (ISO 4217 minor unit 2). */
export const CURRENCIES = ['USD', 'CAD', 'EUR', 'GBP', 'AUD'] as const
export type Currency = (typeof CURRENCIES)[number]
export const CURRENCY_LABELS: Record<Currency, string> = {
  USD: 'US dollar (USD)', CAD: 'Canadian dollar (CAD)', EUR: 'Euro (EUR)', GBP: 'Pound sterling (GBP)', AUD: 'Australian dollar (AUD)',
}

const formats = new Map<Currency, Intl.NumberFormat>()

/** "$1,234.56", "CA$1,234.56", "€1,234.56" for tables and e-mails: integer cents in the shop's currency. */
export function showMoney(cents: number | null | undefined, currency: Currency = 'USD'): string {
  if (cents === null || cents === undefined) return '—'
  let format = formats.get(currency)
  if (!format) {
    format = new Intl.NumberFormat('en', { style: 'currency', currency, minimumFractionDigits: 2, maximumFractionDigits: 2 })
    formats.set(currency, format)
  }
  // Whole cents divided by 100 are exact to the two decimals shown.
  return format.format(Math.round(cents) / 100)
}
