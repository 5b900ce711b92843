// Lengths are stored in millimetres and shown in millimetres or inches by preference.
// 25.4 mm per inch exactly (international yard and pound agreement, 1959). Pure.
export const MM_PER_INCH = 25.4
// 0.3048 m per foot exactly (the same agreement): surface speeds in feet per minute for inch users.
export const M_PER_FOOT = 0.3048
export type LengthUnit = 'mm' | 'in'

export const mmToIn = (mm: number) => mm / MM_PER_INCH
export const inToMm = (inches: number) => inches * MM_PER_INCH

/** Common fractional inch sizes of router bits, to name a diameter the way the shop does. */
const FRACTIONS = [[1, 16], [3, 32], [1, 8], [5, 32], [3, 16], [1, 4], [5, 16], [3, 8], [7, 16], [1, 2], [5, 8], [3, 4], [7, 8], [1, 1]] as const

/** "1/4"" when the length is a common fraction of an inch (within 0.01 mm), else undefined. */
export function inchFraction(mm: number): string | undefined {
  for (const [n, d] of FRACTIONS) {
    if (Math.abs(inToMm(n / d) - mm) <= 0.01) return d === 1 ? `${n}"` : `${n}/${d}"`
  }
  return undefined
}

/** A length for display: "6.35 mm" or "0.250 in" (three decimals, the usual inch precision). */
export function formatLength(mm: number, unit: LengthUnit): string {
  return unit === 'in' ? `${mmToIn(mm).toFixed(3)} in` : `${Number(mm.toFixed(3))} mm`
}

/** A value typed in the user's unit, back to millimetres. */
export function toMm(value: number, unit: LengthUnit): number {
  return unit === 'in' ? inToMm(value) : value
}

/** Surface speed: m/min to ft/min (SFM). */
export const mPerMinToFtPerMin = (v: number) => v / M_PER_FOOT
/** Surface speed: ft/min to m/min. */
export const ftPerMinToMPerMin = (v: number) => v * M_PER_FOOT

/** Feed rates: mm/min to in/min. */
export const mmPerMinToInPerMin = (v: number) => v / MM_PER_INCH

/** A feed for display: "2000 mm/min" or "78.7 in/min". */
export function formatFeed(mmPerMin: number, unit: LengthUnit): string {
  return unit === 'in' ? `${mmPerMinToInPerMin(mmPerMin).toFixed(1)} in/min` : `${Number(mmPerMin.toFixed(1))} mm/min`
}
