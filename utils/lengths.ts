// Lengths and feeds as the operator reads them: millimetres or inches by preference.
import type { LengthUnit } from '~~/stores/preferences'

export const MM_PER_INCH = 25.4

/** "6.35 mm" or "0.250 in": three decimals of an inch is how bit sizes are read. */
export function formatLength(mm: number, unit: LengthUnit): string {
  return unit === 'in' ? `${(mm / MM_PER_INCH).toFixed(3)} in` : `${trimTrailingZeros(mm.toFixed(3))} mm`
}

/** A feed in mm/min as inches per minute, one decimal. */
export function feedInInchesPerMinute(mmPerMin: number): string {
  return `${(mmPerMin / MM_PER_INCH).toFixed(1)} in/min`
}

export function trimTrailingZeros(text: string): string {
  return text.includes('.') ? text.replace(/\.?0+$/, '') : text
}
