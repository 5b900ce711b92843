// What a cutter's label says: the URL its QR code holds and the cutter type in short. Pure.
import { MM_PER_INCH } from './units'

export type Profile = 'square_end' | 'ball_nose' | 'v_bit' | 'o_flute'
export type Helix = 'upcut' | 'downcut' | 'compression' | 'straight'

/** The cutter page a label's QR code opens. The label PNG and the label sheet both use this. */
export function cutterPageUrl(baseUrl: string, code: string): string {
  return `${baseUrl.replace(/\/+$/, '')}/c/${encodeURIComponent(code)}`
}

/** How close a diameter must be to a fraction of an inch to be called by it (plus a hair for
 *  binary floating point, in which 6.36 - 6.35 is a little over 0.01). */
const FRACTION_TOLERANCE_MM = 0.01 + 1e-9

/** The step router bits are sold in at each size: 32nds up to 1/4" (engraving and small
 *  bits), 16ths up to 1", 8ths above. Finer steps would name metric sizes by odd fractions
 *  (25 mm is within 0.003 mm of 63/64"). */
function fractionStep(inches: number): number {
  if (inches <= 0.25 + 1e-9) return 32
  if (inches <= 1 + 1e-9) return 16
  return 8
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b)
}

/** A diameter as a common fraction of an inch (`1/4"`, `1"`, `1-1/4"`), or null when it is not one. */
export function inchFraction(mm: number): string | null {
  if (!(mm > 0)) return null
  const inches = mm / MM_PER_INCH
  const step = fractionStep(inches)
  const steps = Math.round(inches * step)
  if (steps === 0 || Math.abs((steps * MM_PER_INCH) / step - mm) > FRACTION_TOLERANCE_MM) return null
  const whole = Math.floor(steps / step)
  const rest = steps % step
  if (rest === 0) return `${whole}"`
  const d = gcd(rest, step)
  const fraction = `${rest / d}/${step / d}`
  return whole ? `${whole}-${fraction}"` : `${fraction}"`
}

/** Millimetres to at most three decimals, as the catalogue stores them: 6.35, 3.175, 8. */
export function formatMm(mm: number): string {
  return `${Number(mm.toFixed(3))} mm`
}

/** The diameter as the shop says it: both units when it is a common inch size, else millimetres. */
export function diameterText(mm: number, prefer: 'mm' | 'in' = 'mm'): string {
  const fraction = inchFraction(mm)
  if (!fraction) return formatMm(mm)
  return prefer === 'in' ? `${fraction} · ${formatMm(mm)}` : `${formatMm(mm)} · ${fraction}`
}

export interface TypeForLabel {
  cuttingDiameterMm: number
  profile: Profile
  vAngleDeg: number | null
  flutes: number
  helix: Helix
}

export function profileText(profile: Profile, vAngleDeg: number | null): string {
  switch (profile) {
    case 'square_end': return 'square end'
    case 'ball_nose': return 'ball nose'
    case 'o_flute': return 'O-flute'
    case 'v_bit': return vAngleDeg ? `V ${Number(vAngleDeg.toFixed(1))}°` : 'V'
  }
}

/** The cutter type in short for a label: `6.35 mm · 1/4" · square end · 2F · upcut`. */
export function typeShort(type: TypeForLabel, prefer: 'mm' | 'in' = 'mm'): string {
  return [
    diameterText(type.cuttingDiameterMm, prefer),
    profileText(type.profile, type.vAngleDeg),
    `${type.flutes}F`,
    type.helix,
  ].join(' · ')
}
