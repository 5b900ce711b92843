// Numbers as people type them into forms and CSV cells: decimals, lengths in either unit (inch
// fractions too), percentages. Pure. Each returns undefined for text it cannot read.
import { inToMm, mmToIn, type LengthUnit } from './units'

const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/

/** Rounds half up in decimal: 4.7625 to 4.763, where 4.7625 * 1000 is 4762.4999... in binary. */
export function roundTo(value: number, decimals: number): number {
  const text = String(value)
  if (text.includes('e')) return Math.round(value * 10 ** decimals) / 10 ** decimals
  return Number(`${Math.round(Number(`${text}e${decimals}`))}e-${decimals}`)
}

export function parseDecimal(text: string): number | undefined {
  const s = text.trim()
  return DECIMAL.test(s) ? Number(s) : undefined
}

/** Inches as "0.25", "1/4", "1 1/4" or "1-1/4" (with an optional " or in). */
function parseInches(text: string): number | undefined {
  const s = text.trim().replace(/\s*(?:"|in|inch|inches)$/i, '').trim()
  const mixed = /^(?:(\d+)[\s-]+)?(\d+)\/(\d+)$/.exec(s)
  if (mixed) {
    const denominator = Number(mixed[3])
    return denominator ? Number(mixed[1] ?? 0) + Number(mixed[2]) / denominator : undefined
  }
  return parseDecimal(s)
}

/** A length typed in the person's unit, in millimetres to the database's 0.001 mm. */
export function parseLength(text: string, unit: LengthUnit): number | undefined {
  const value = unit === 'in' ? parseInches(text) : parseDecimal(text.trim().replace(/\s*mm$/i, ''))
  if (value === undefined) return undefined
  // 3/16 in is 4.7625 mm, which the multiplication leaves as 4.76249999...: clear that noise first.
  return roundTo(roundTo(unit === 'in' ? inToMm(value) : value, 9), 3)
}

/** A length in mm shown for typing in the person's unit: 6.35 → "0.25" in inches, "6.35" in mm. */
export function lengthText(mm: number | null | undefined, unit: LengthUnit): string {
  if (mm === null || mm === undefined) return ''
  return String(unit === 'in' ? roundTo(mmToIn(mm), 4) : roundTo(mm, 3))
}

/** "45", "45 %" or "45%" as the fraction 0.45. */
export function parsePercent(text: string): number | undefined {
  const value = parseDecimal(text.trim().replace(/\s*%$/, ''))
  return value === undefined ? undefined : roundTo(value / 100, 6)
}

/** A service level typed as a percentage ("95", "99.5 %") or a fraction ("0.95"): the fraction. */
export function parseServiceLevel(text: string): number | undefined {
  const s = text.trim()
  const value = parseDecimal(s.replace(/\s*%$/, ''))
  if (value === undefined) return undefined
  // Above 1 (or marked with %) it can only be a percentage.
  return roundTo(value > 1 || s.endsWith('%') ? value / 100 : value, 4)
}
