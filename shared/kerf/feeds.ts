// Feeds and speeds (docs/domain.md, computation 5): spindle speed from a surface-speed target and the
// cutting diameter, clamped to the machine's range; feed = rpm × flutes × chip load; plunge and
// depth per pass as starting points; and the warnings for setups known to melt plastic.
// Pure: no framework or database imports.
import type { ChipLoadBand } from './chip-loads'
import { MM_PER_INCH } from './units'
import type { MaterialFamily } from './materials'

export type Helix = 'upcut' | 'downcut' | 'compression' | 'straight'
export type Profile = 'square_end' | 'ball_nose' | 'v_bit' | 'o_flute'

/** n = 1000·Vc / (π·D): rpm from surface speed in m/min and diameter in mm. */
export function spindleSpeed(surfaceSpeedMPerMin: number, diameterMm: number): number {
  if (!(surfaceSpeedMPerMin > 0) || !(diameterMm > 0)) throw new RangeError('spindleSpeed needs a positive surface speed and diameter')
  return (1000 * surfaceSpeedMPerMin) / (Math.PI * diameterMm)
}

/** Vc = π·D·n / 1000: surface speed in m/min at a spindle speed. */
export function surfaceSpeed(rpm: number, diameterMm: number): number {
  return (Math.PI * diameterMm * rpm) / 1000
}

/** The inch form, RPM = 12·SFM / (π·D) with D in inches: the same relation in other units. */
export function spindleSpeedInch(surfaceFeetPerMin: number, diameterIn: number): number {
  if (!(surfaceFeetPerMin > 0) || !(diameterIn > 0)) throw new RangeError('spindleSpeedInch needs a positive surface speed and diameter')
  return (12 * surfaceFeetPerMin) / (Math.PI * diameterIn)
}

/** vf = n · z · fz, in the length unit of the chip load per minute. */
export function feedRate(rpm: number, flutes: number, chipLoad: number): number {
  return rpm * flutes * chipLoad
}

/** fz = vf / (n · z): the chip load a feed gives. */
export function chipLoadOf(feed: number, rpm: number, flutes: number): number {
  return feed / (rpm * flutes)
}

/** Common practice: reduce the chip load about 25 % at a cutting depth of 2×D and about 50 % at
 *  3×D. Applied as the steps it is stated in, not interpolated between them. */
export function depthChipFactor(depthMm: number | null | undefined, diameterMm: number): number {
  if (!depthMm || !(depthMm > 0)) return 1
  if (depthMm >= 3 * diameterMm) return 0.5
  if (depthMm >= 2 * diameterMm) return 0.75
  return 1
}

/** Families in which chips melt and weld: foam counts, the starting list's foam being PVC. */
export const PLASTIC_FAMILIES: readonly MaterialFamily[] = ['hard_plastic', 'soft_plastic', 'foam']
export const isPlastic = (family: MaterialFamily) => PLASTIC_FAMILIES.includes(family)

/** How well a geometry suits plastic, best first (common practice: a single-flute upcut lifts
 *  large chips out of the cut; downcut and compression pack them in, where they melt). */
export function plasticGeometryRank(t: { flutes: number, helix: Helix }): number {
  if (t.helix === 'downcut' || t.helix === 'compression') return 3
  if (t.helix === 'straight') return 2
  return t.flutes === 1 ? 0 : 1
}

export type FeedsWarningCode = 'downcut_in_plastic' | 'chip_load_low' | 'spindle_out_of_range' | 'dull_in_hard_plastic' | 'single_flute_in_crib'
export interface FeedsWarning { code: FeedsWarningCode, message: string }

export interface FeedsInput {
  family: MaterialFamily
  /** The cutter's measured diameter when known (a reground bit is smaller), else the type's. */
  diameterMm: number
  flutes: number
  helix: Helix
  profile: Profile
  cuttingLengthMm?: number | null
  machine: { name: string, minRpm: number, maxRpm: number }
  band: ChipLoadBand
  /** How deep the bit cuts, for the chip-load reduction at 2×D and 3×D. */
  depthMm?: number | null
  /** The loaded cutter's life used and the shop's due threshold, for the dull-bit warning. */
  lifeUsed?: number | null
  lifeThreshold?: number | null
  /** A single-flute upcut of the same diameter waiting in the crib, found by the caller. */
  singleFluteInCrib?: { typeName: string } | null
}

export interface FeedsResult {
  rpm: number
  /** The speed the surface-speed target asks for before clamping; null without a target. */
  rpmTarget: number | null
  rpmClamped: 'min' | 'max' | null
  surfaceSpeedMPerMin: number
  surfaceSpeedTargetMPerMin: number | null
  chipLoadMm: number
  chipLoadRangeMm: { min: number, max: number }
  depthChipFactor: number
  feedMmPerMin: number
  feedInPerMin: number
  plungeMmPerMin: number | null
  plungeInPerMin: number | null
  depthPerPassMm: number | null
  warnings: FeedsWarning[]
  notes: string[]
}

const round = (v: number, places: number) => Math.round(v * 10 ** places) / 10 ** places
const rpmText = (n: number) => `${Math.round(n).toLocaleString('en-US')} rpm`
const mmText = (mm: number) => `${round(mm, 3)} mm`
// A hair of slack so that a figure equal to a limit, after floating-point arithmetic, counts as equal.
const EPS = 1e-9

/**
 * The starting settings for one bit in one material on one machine.
 *
 * How rpm is chosen: from the band's surface-speed target, n = 1000·Vc/(π·D), clamped to the
 * machine's range; without a target, the machine's top speed (routers usually run there). A
 * target above the top speed is the common case for small bits and the safe side (a slower edge
 * runs cooler), so it is only noted; a target below the lowest speed warns, because the edge then
 * runs faster and hotter than intended. The chip load is the middle of the band's range, reduced
 * for deep cuts, and the feed follows from rpm × flutes × chip load, so clamping the rpm moves
 * the feed and keeps the chip.
 */
export function computeFeeds(input: FeedsInput): FeedsResult {
  const { band, machine, diameterMm: d, flutes } = input
  if (!(d > 0) || !(flutes >= 1)) throw new RangeError('computeFeeds needs a positive diameter and at least one flute')
  const warnings: FeedsWarning[] = []
  const notes: string[] = []
  const plastic = isPlastic(input.family)

  const rpmTarget = band.surfaceSpeedMPerMin ? spindleSpeed(band.surfaceSpeedMPerMin, d) : null
  let rpm = Math.round(rpmTarget ?? machine.maxRpm)
  let rpmClamped: FeedsResult['rpmClamped'] = null
  if (rpm > machine.maxRpm) {
    rpmClamped = 'max'
    notes.push(`The surface-speed target asks for ${rpmText(rpmTarget!)}; ${machine.name} tops out at ${rpmText(machine.maxRpm)}, so that is used and the feed is lowered to keep the chip load.`)
    rpm = machine.maxRpm
  } else if (rpm < machine.minRpm) {
    rpmClamped = 'min'
    warnings.push({
      code: 'spindle_out_of_range',
      message: `This bit's surface-speed target needs ${rpmText(rpmTarget!)}, below the lowest speed of ${machine.name} (${rpmText(machine.minRpm)}). `
        + `The figures use ${rpmText(machine.minRpm)}: the edge runs faster than intended and heats up more${plastic ? ', which can melt plastic' : ''}. A smaller bit or a slower machine fits better.`,
    })
    rpm = machine.minRpm
  } else if (rpmTarget === null) {
    notes.push(`No surface-speed target for this family and size: the spindle runs at the top of the range of ${machine.name}.`)
  }

  const factor = depthChipFactor(input.depthMm, d)
  const chipLoadMm = ((band.chipLoadMinMm + band.chipLoadMaxMm) / 2) * factor
  const feedMmPerMin = feedRate(rpm, flutes, chipLoadMm)
  if (factor < 1) {
    notes.push(`Cutting ${mmText(input.depthMm!)} deep (${round(input.depthMm! / d, 1)}×D): chip load reduced by ${Math.round((1 - factor) * 100)} % (common practice at ${factor === 0.5 ? '3' : '2'}×D).`)
  }
  if (chipLoadMm < band.chipLoadMinMm - EPS) {
    warnings.push({
      code: 'chip_load_low',
      message: `The chip load drops to ${mmText(chipLoadMm)} per tooth, below this family's ${mmText(band.chipLoadMinMm)}: the edge rubs instead of cutting, `
        + `and the heat ${plastic ? 'melts plastic and welds chips to the bit' : 'burns the stock and dulls the edge'}. Take shallower passes instead of slowing the feed.`,
    })
  }

  const cap = input.cuttingLengthMm && input.cuttingLengthMm > 0 ? input.cuttingLengthMm : Infinity
  const depthPerPassMm = band.depthPerPassFactor ? Math.min(band.depthPerPassFactor * d, cap) : null
  const plungeMmPerMin = band.plungeFraction ? feedMmPerMin * band.plungeFraction : null

  if (plastic && (input.helix === 'downcut' || input.helix === 'compression')) {
    warnings.push({
      code: 'downcut_in_plastic',
      message: `A ${input.helix} bit pushes chips down into the cut. In plastic they are cut again and weld to the bit and the edge: use an upcut, single-flute if there is one.`,
    })
  }
  if (input.family === 'hard_plastic' && input.lifeUsed != null && input.lifeThreshold != null && input.lifeUsed >= input.lifeThreshold - EPS) {
    warnings.push({
      code: 'dull_in_hard_plastic',
      message: `This bit has used ${Math.round(input.lifeUsed * 100)} % of its life, at or past the shop's ${Math.round(input.lifeThreshold * 100)} % due mark. `
        + 'A dull edge rubs and melts hard plastic and chips the cut face: take a sharp bit.',
    })
  }
  if (plastic && flutes >= 2 && input.singleFluteInCrib) {
    warnings.push({
      code: 'single_flute_in_crib',
      message: `${input.singleFluteInCrib.typeName} has the same diameter and one flute, and one is in the crib. `
        + 'At the same feed a single flute cuts a chip twice as thick and lifts it out, so the plastic stays cooler.',
    })
  }
  if (input.profile === 'v_bit' || input.profile === 'ball_nose') {
    notes.push('A V-bit or ball-nose cuts at less than its full diameter at shallow depths: these figures use the full diameter, so start at the lower feed.')
  }

  return {
    rpm,
    rpmTarget: rpmTarget === null ? null : round(rpmTarget, 1),
    rpmClamped,
    surfaceSpeedMPerMin: round(surfaceSpeed(rpm, d), 1),
    surfaceSpeedTargetMPerMin: band.surfaceSpeedMPerMin,
    chipLoadMm: round(chipLoadMm, 4),
    chipLoadRangeMm: { min: band.chipLoadMinMm, max: band.chipLoadMaxMm },
    depthChipFactor: factor,
    feedMmPerMin: round(feedMmPerMin, 1),
    feedInPerMin: round(feedMmPerMin / MM_PER_INCH, 1),
    plungeMmPerMin: plungeMmPerMin === null ? null : round(plungeMmPerMin, 1),
    plungeInPerMin: plungeMmPerMin === null ? null : round(plungeMmPerMin / MM_PER_INCH, 1),
    depthPerPassMm: depthPerPassMm === null ? null : round(depthPerPassMm, 2),
    warnings,
    notes,
  }
}

/** Shown with every recommendation (docs/domain.md, computation 5: UK HSE WIS 22, US OSHA 3157). */
export const CAUTIONS: readonly string[] = [
  'Wear eye and hearing protection at the router.',
  'Run the dust extraction at the cutter: wood and MDF dust harm the lungs, and fine dust can burn.',
  'Hold the work down and leave tabs on small parts so that nothing is thrown.',
  'Never leave a cut of plastic or MDF unattended: hot chips can ignite.',
  'Cutting acrylic gives off fumes: keep the extraction and ventilation running.',
  'These are starting points: the bit maker\'s data, the machine\'s manual and local codes govern.',
]
