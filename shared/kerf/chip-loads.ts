// The shop's chip-load table (by material family and diameter band) and the starting rows every
// shop gets, converted from the common-practice router ranges in inches per tooth. Pure.
import { MATERIAL_FAMILIES, type MaterialFamily } from './materials'
import { MM_PER_INCH } from './units'

export interface ChipLoadBand {
  family: MaterialFamily
  /** The band holds diameters from min (inclusive) to max (exclusive), in mm. */
  diameterMinMm: number
  diameterMaxMm: number
  chipLoadMinMm: number
  chipLoadMaxMm: number
  /** Null: no target, the spindle runs at the machine's top speed. */
  surfaceSpeedMPerMin: number | null
  /** Plunge feed as a fraction of the cutting feed; null: no suggestion. */
  plungeFraction: number | null
  /** Depth per pass as a multiple of the cutting diameter; null: no suggestion. */
  depthPerPassFactor: number | null
  source: string
}

// Band edges sit halfway between the nominal sizes, so 1/8 in, 1/4 in and 3/8–1/2 in bits (and
// reground ones a little under size) each land in their own band.
const EDGE = { small: 3 / 16, medium: 5 / 16, large: 9 / 16 }
export const BAND_EDGES_MM = [0, EDGE.small * MM_PER_INCH, EDGE.medium * MM_PER_INCH, EDGE.large * MM_PER_INCH] as const

/** The band's name in the shop's words: "up to 3/16 in", "3/16 to 5/16 in", "5/16 to 9/16 in". */
export function bandLabel(band: Pick<ChipLoadBand, 'diameterMinMm' | 'diameterMaxMm'>): string {
  const inch = (mm: number) => {
    for (const [size, text] of [[EDGE.small, '3/16'], [EDGE.medium, '5/16'], [EDGE.large, '9/16']] as const) {
      if (Math.abs(size * MM_PER_INCH - mm) < 0.001) return text
    }
    return undefined
  }
  const [lo, hi] = [inch(band.diameterMinMm), inch(band.diameterMaxMm)]
  const mm = (v: number) => Number(v.toFixed(2))
  if (band.diameterMinMm <= 0) return hi ? `up to ${hi} in` : `up to ${mm(band.diameterMaxMm)} mm`
  return lo && hi ? `${lo} to ${hi} in` : `${mm(band.diameterMinMm)} to ${mm(band.diameterMaxMm)} mm`
}

// Router chip loads in inches per tooth for a 1/8 in and a 1/4 in bit: common practice, the same
// ranges appear across many makers' published charts (docs/domain.md, computation 5).
const COMMON_PRACTICE_IN = {
  hardwood: { eighth: [0.002, 0.005], quarter: [0.005, 0.011] },
  mdf: { eighth: [0.004, 0.007], quarter: [0.012, 0.016] },
  softPlastic: { eighth: [0.003, 0.006], quarter: [0.006, 0.010] },
  hardPlastic: { eighth: [0.002, 0.004], quarter: [0.005, 0.009] },
  aluminium: { eighth: [0.003, 0.004], quarter: [0.005, 0.007] },
} as const
type Row = keyof typeof COMMON_PRACTICE_IN

// Which common-practice row each family starts from, and why where it is not obvious.
const FAMILY_ROW: Record<MaterialFamily, { row: Row, name: string }> = {
  hard_plastic: { row: 'hardPlastic', name: 'hard plastic (cast acrylic)' },
  soft_plastic: { row: 'softPlastic', name: 'soft plastic' },
  // The stricter of hardwood and softwood: the family holds both.
  wood: { row: 'hardwood', name: 'hardwood' },
  sheet_goods: { row: 'mdf', name: 'MDF and particleboard' },
  // The starting list's foam is PVC foam board, which the soft plastic row covers.
  foam: { row: 'softPlastic', name: 'soft plastic (PVC)' },
  non_ferrous: { row: 'aluminium', name: 'aluminium' },
  // Aluminium composite panel: its skins are aluminium.
  composite: { row: 'aluminium', name: 'aluminium' },
}

/** Kerfbook's rule for the 3/8–1/2 in band, which the common-practice table does not give:
 *  chip load in proportion to diameter from the 1/4 in range, taken at 3/8 in (× 1.5), the
 *  band's smallest size, so that the larger bits in it start on the low side. */
export const LARGE_BAND_SCALE = 1.5

// Surface speed targets, Kerfbook's starting points: a 1/4 in bit at 18,000 rpm (the middle of
// the 12,000–24,000 rpm that router spindles commonly run), about 359 m/min; aluminium and
// composite at 0.6 of that, the Stanford PRL ratio of aluminium to plastic cutting speed
// (300/500 SFM). Smaller bits ask for more than a router turns and run at its top speed.
const ROUTER_REFERENCE_M_PER_MIN = Math.round((Math.PI * 6.35 * 18000) / 1000)
const SURFACE_SPEED: Record<MaterialFamily, number> = {
  hard_plastic: ROUTER_REFERENCE_M_PER_MIN,
  soft_plastic: ROUTER_REFERENCE_M_PER_MIN,
  wood: ROUTER_REFERENCE_M_PER_MIN,
  sheet_goods: ROUTER_REFERENCE_M_PER_MIN,
  foam: ROUTER_REFERENCE_M_PER_MIN,
  non_ferrous: Math.round(ROUTER_REFERENCE_M_PER_MIN * (300 / 500)),
  composite: Math.round(ROUTER_REFERENCE_M_PER_MIN * (300 / 500)),
}

// Common practice: plunge at a third to a half of the cutting feed, slower in hard and metal
// stock; a pass about one diameter deep in wood and soft stock, less in hard plastic and metal.
const PLUNGE_FRACTION: Record<MaterialFamily, number> = {
  hard_plastic: 0.333, soft_plastic: 0.5, wood: 0.5, sheet_goods: 0.5, foam: 0.5, non_ferrous: 0.25, composite: 0.333,
}
const DEPTH_FACTOR: Record<MaterialFamily, number> = {
  hard_plastic: 0.5, soft_plastic: 1, wood: 1, sheet_goods: 1, foam: 1, non_ferrous: 0.25, composite: 0.5,
}

const toMm = (inches: number) => Math.round(inches * MM_PER_INCH * 10000) / 10000
const REST = 'Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.'

function startingBands(family: MaterialFamily): ChipLoadBand[] {
  const { row, name } = FAMILY_ROW[family]
  const ranges = COMMON_PRACTICE_IN[row]
  const common = { family, surfaceSpeedMPerMin: SURFACE_SPEED[family], plungeFraction: PLUNGE_FRACTION[family], depthPerPassFactor: DEPTH_FACTOR[family] }
  return [
    {
      ...common, diameterMinMm: toMm(0), diameterMaxMm: toMm(EDGE.small),
      chipLoadMinMm: toMm(ranges.eighth[0]), chipLoadMaxMm: toMm(ranges.eighth[1]),
      source: `Chip load: common practice, ${name} at 1/8 in. ${REST}`,
    },
    {
      ...common, diameterMinMm: toMm(EDGE.small), diameterMaxMm: toMm(EDGE.medium),
      chipLoadMinMm: toMm(ranges.quarter[0]), chipLoadMaxMm: toMm(ranges.quarter[1]),
      source: `Chip load: common practice, ${name} at 1/4 in. ${REST}`,
    },
    {
      ...common, diameterMinMm: toMm(EDGE.medium), diameterMaxMm: toMm(EDGE.large),
      chipLoadMinMm: toMm(ranges.quarter[0] * LARGE_BAND_SCALE), chipLoadMaxMm: toMm(ranges.quarter[1] * LARGE_BAND_SCALE),
      source: `Chip load: Kerfbook rule, the common-practice ${name} range at 1/4 in x 1.5 (in proportion to diameter, at 3/8 in). ${REST}`,
    },
  ]
}

/** The rows a new shop starts with: three diameter bands for every family. */
export const STARTING_CHIP_LOADS: readonly ChipLoadBand[] = MATERIAL_FAMILIES.flatMap(startingBands)

export interface BandChoice<B extends ChipLoadBand> {
  band: B
  /** Set when the diameter lies outside every band and the nearest one is used instead. */
  outside: 'below' | 'above' | null
}

/** The family's band holding the diameter; outside them all, the nearest band (and say so).
 *  Bands are picked, not interpolated: the shop edits a table of ranges and should see the
 *  row it edited used as it stands. */
export function pickBand<B extends ChipLoadBand>(bands: readonly B[], family: MaterialFamily, diameterMm: number): BandChoice<B> | null {
  const own = bands.filter((b) => b.family === family).sort((a, b) => a.diameterMinMm - b.diameterMinMm)
  if (!own.length) return null
  const inside = own.find((b) => diameterMm >= b.diameterMinMm && diameterMm < b.diameterMaxMm)
  if (inside) return { band: inside, outside: null }
  const nearest = own.reduce((best, b) => (distance(b, diameterMm) < distance(best, diameterMm) ? b : best))
  return { band: nearest, outside: diameterMm < nearest.diameterMinMm ? 'below' : 'above' }
}

function distance(b: ChipLoadBand, d: number): number {
  return d < b.diameterMinMm ? b.diameterMinMm - d : d >= b.diameterMaxMm ? d - b.diameterMaxMm : 0
}
