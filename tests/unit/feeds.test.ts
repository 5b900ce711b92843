// Feeds and speeds against the machining handbook relations n = 1000·Vc/(π·D) (inch form
// RPM = 12·SFM/(π·D)) and vf = n·z·fz, worked examples from a textbook and a university shop,
// the chip-load table's starting rows, each warning at its boundary, and the trade's ordering facts.
import { describe, expect, it } from 'vitest'
import { BAND_EDGES_MM, STARTING_CHIP_LOADS, bandLabel, pickBand, type ChipLoadBand } from '../../shared/kerf/chip-loads'
import {
  CAUTIONS, chipLoadOf, computeFeeds, depthChipFactor, feedRate, plasticGeometryRank, spindleSpeed, spindleSpeedInch, surfaceSpeed,
  type FeedsInput,
} from '../../shared/kerf/feeds'
import { MATERIAL_FAMILIES, type MaterialFamily } from '../../shared/kerf/materials'
import { MM_PER_INCH } from '../../shared/kerf/units'

const MACHINE = { name: 'Test router', minRpm: 6000, maxRpm: 24000 }
const band = (over: Partial<ChipLoadBand> = {}): ChipLoadBand => ({
  family: 'hard_plastic', diameterMinMm: 4.7625, diameterMaxMm: 7.9375, chipLoadMinMm: 0.127, chipLoadMaxMm: 0.2286,
  surfaceSpeedMPerMin: 359, plungeFraction: 0.333, depthPerPassFactor: 0.5, source: 'test', ...over,
})
const input = (over: Partial<FeedsInput> = {}): FeedsInput => ({
  family: 'hard_plastic', diameterMm: 6.35, flutes: 1, helix: 'upcut', profile: 'o_flute', cuttingLengthMm: 22,
  machine: MACHINE, band: band(), ...over,
})
const codes = (i: FeedsInput) => computeFeeds(i).warnings.map((w) => w.code)
const starting = (family: MaterialFamily, d: number) => pickBand(STARTING_CHIP_LOADS, family, d)!.band

describe('spindle speed, surface speed and feed: worked examples', () => {
  it('Groover, peripheral milling example (from memory): D = 80 mm, 5 teeth, v = 70 m/min, fz = 0.25 mm', () => {
    // Groover, Fundamentals of Modern Manufacturing, chapter on machining operations (from memory):
    // N = 278.5 rpm, feed rate 348.2 mm/min. Tolerance: half of the last printed digit.
    const n = spindleSpeed(70, 80)
    expect(Math.abs(n - 278.5)).toBeLessThanOrEqual(0.05)
    expect(Math.abs(feedRate(n, 5, 0.25) - 348.2)).toBeLessThanOrEqual(0.05)
    expect(surfaceSpeed(n, 80)).toBeCloseTo(70, 9)
  })

  it('Stanford PRL, "Mill speeds and feeds": a 3/8 in cutter in mild steel at 100 SFM runs at 1018.6 rpm', () => {
    // Stanford Product Realization Lab (K. Kuchenbecker, 2001): mild steel 100 SFM [text];
    // 12·100/(π·0.375) = 1018.6 rpm [computed]. This uses the exact relation, not the shop
    // shortcut 4·CS/D, which gives 1066.7 (4.7 % faster). Tolerance ±0.05 rpm.
    const n = spindleSpeedInch(100, 0.375)
    expect(Math.abs(n - 1018.6)).toBeLessThanOrEqual(0.05)
    expect(Math.abs((4 * 100) / 0.375 - 1066.7)).toBeLessThanOrEqual(0.05)
    expect(n).not.toBeCloseTo(1066.7, 0)
  })

  it('Stanford PRL: 4 flutes at 1000 rpm with 0.005 in per tooth feed 20.0 in/min', () => {
    // Stanford PRL: chip load 0.005 in roughing [text]; 1000 × 4 × 0.005 = 20.0 in/min [computed]. Tolerance ±0.05.
    expect(Math.abs(feedRate(1000, 4, 0.005) - 20.0)).toBeLessThanOrEqual(0.05)
    expect(chipLoadOf(20, 1000, 4)).toBeCloseTo(0.005, 12)
  })

  it('Stanford PRL: a 1/4 in cutter in plastic at 500 SFM runs at 7639.4 rpm', () => {
    // Stanford PRL: plastic 500 SFM [text]; 12·500/(π·0.25) = 7639.4 rpm [computed]. Tolerance ±0.05 rpm.
    expect(Math.abs(spindleSpeedInch(500, 0.25) - 7639.4)).toBeLessThanOrEqual(0.05)
  })
})

describe('inch and metric give the same physical result (25.4 mm per inch exactly, 1959 agreement)', () => {
  it('spindle speed: 100 SFM on 3/8 in equals 30.48 m/min on 9.525 mm', () => {
    // 1 ft = 12 × 25.4 mm = 0.3048 m exactly.
    expect(spindleSpeed(100 * 0.3048, 0.375 * MM_PER_INCH)).toBeCloseTo(spindleSpeedInch(100, 0.375), 9)
    expect(spindleSpeed(152.4, 6.35)).toBeCloseTo(spindleSpeedInch(500, 0.25), 9)
  })

  it('feed: 0.005 in per tooth and 0.127 mm per tooth give 20 in/min and 508 mm/min', () => {
    expect(feedRate(1000, 4, 0.005 * MM_PER_INCH)).toBeCloseTo(feedRate(1000, 4, 0.005) * MM_PER_INCH, 9)
    expect(feedRate(1000, 4, 0.127)).toBeCloseTo(508, 9)
  })

  it('the result reports one feed in both units', () => {
    const r = computeFeeds(input())
    expect(Math.abs(r.feedInPerMin * MM_PER_INCH - r.feedMmPerMin)).toBeLessThanOrEqual(0.05 * MM_PER_INCH)
  })
})

describe('the starting chip-load table (common practice, docs/domain.md computation 5)', () => {
  it('converts the inch ranges to millimetres: hardwood at 1/8 in is 0.002–0.005 in, 0.0508–0.127 mm', () => {
    const b = starting('wood', 3.175)
    expect(b.chipLoadMinMm).toBe(0.0508)
    expect(b.chipLoadMaxMm).toBe(0.127)
    expect(starting('sheet_goods', 6.35)).toMatchObject({ chipLoadMinMm: 0.3048, chipLoadMaxMm: 0.4064 })
    expect(starting('hard_plastic', 6.35)).toMatchObject({ chipLoadMinMm: 0.127, chipLoadMaxMm: 0.2286 })
  })

  it('extends to 3/8–1/2 in by the stated rule (the 1/4 in range × 1.5) and says so', () => {
    const b = starting('soft_plastic', 9.525)
    expect(b.chipLoadMinMm).toBeCloseTo(0.006 * 1.5 * 25.4, 4)
    expect(b.chipLoadMaxMm).toBeCloseTo(0.010 * 1.5 * 25.4, 4)
    expect(b.source).toContain('Kerfbook rule')
  })

  it('gives every family three contiguous bands, each with a source', () => {
    for (const family of MATERIAL_FAMILIES) {
      const rows = STARTING_CHIP_LOADS.filter((b) => b.family === family)
      expect(rows.map((b) => [b.diameterMinMm, b.diameterMaxMm])).toEqual([[0, 4.7625], [4.7625, 7.9375], [7.9375, 14.2875]])
      for (const b of rows) {
        expect(b.chipLoadMinMm).toBeLessThanOrEqual(b.chipLoadMaxMm)
        expect(b.source).toMatch(/common practice|Kerfbook rule/)
      }
    }
    expect(BAND_EDGES_MM[3]).toBeCloseTo(14.2875, 9)
    expect(bandLabel({ diameterMinMm: 4.7625, diameterMaxMm: 7.9375 })).toBe('3/16 to 5/16 in')
  })

  it('picks the band holding the diameter (lower edge inside), or the nearest one and says so', () => {
    expect(pickBand(STARTING_CHIP_LOADS, 'wood', 4.7625)!.band.diameterMinMm).toBe(4.7625)
    expect(pickBand(STARTING_CHIP_LOADS, 'wood', 4.76)!.band.diameterMinMm).toBe(0)
    expect(pickBand(STARTING_CHIP_LOADS, 'wood', 6.2)).toMatchObject({ band: { diameterMinMm: 4.7625 }, outside: null })
    expect(pickBand(STARTING_CHIP_LOADS, 'wood', 19.05)).toMatchObject({ band: { diameterMinMm: 7.9375 }, outside: 'above' })
    expect(pickBand([], 'wood', 6.35)).toBeNull()
  })
})

describe('computing the starting settings', () => {
  it('takes rpm from the surface-speed target and the middle of the chip-load range', () => {
    const r = computeFeeds(input())
    // 1000 × 359 / (π × 6.35) = 17,995.7 → 17,996 rpm; 17,996 × 1 × 0.1778 = 3199.7 mm/min.
    expect(r.rpm).toBe(17996)
    expect(r.chipLoadMm).toBeCloseTo(0.1778, 4)
    expect(r.feedMmPerMin).toBeCloseTo(3199.7, 1)
    expect(r.surfaceSpeedMPerMin).toBeCloseTo(359, 0)
    expect(r.plungeMmPerMin).toBeCloseTo(3199.7 * 0.333, 0)
    expect(r.depthPerPassMm).toBeCloseTo(3.18, 2)
    expect(r.warnings).toEqual([])
  })

  it('clamps to the machine\'s top speed for a small bit, says so, and keeps the chip load', () => {
    const r = computeFeeds(input({ diameterMm: 3.175, band: band({ diameterMinMm: 0, diameterMaxMm: 4.7625, chipLoadMinMm: 0.0508, chipLoadMaxMm: 0.1016 }) }))
    expect(r.rpmTarget).toBeGreaterThan(24000)
    expect(r.rpm).toBe(24000)
    expect(r.rpmClamped).toBe('max')
    expect(r.notes.join(' ')).toMatch(/tops out at 24,000 rpm/)
    expect(r.feedMmPerMin).toBeCloseTo(24000 * 0.0762, 1)
  })

  it('runs at the top speed when the row has no surface-speed target', () => {
    expect(computeFeeds(input({ band: band({ surfaceSpeedMPerMin: null }) }))).toMatchObject({ rpm: 24000, rpmTarget: null, rpmClamped: null })
  })

  it('keeps the depth per pass within the bit\'s cutting length', () => {
    expect(computeFeeds(input({ band: band({ depthPerPassFactor: 5 }), cuttingLengthMm: 22 })).depthPerPassMm).toBe(22)
  })

  it('reduces the chip load in steps: 25 % from 2×D, 50 % from 3×D (common practice)', () => {
    expect(depthChipFactor(null, 6)).toBe(1)
    expect(depthChipFactor(11.999, 6)).toBe(1)
    expect(depthChipFactor(12, 6)).toBe(0.75)
    expect(depthChipFactor(17.999, 6)).toBe(0.75)
    expect(depthChipFactor(18, 6)).toBe(0.5)
    const full = computeFeeds(input({ band: band({ chipLoadMinMm: 0.05 }) })).chipLoadMm
    expect(computeFeeds(input({ band: band({ chipLoadMinMm: 0.05 }), depthMm: 12.7 })).chipLoadMm).toBeCloseTo(full * 0.75, 4)
  })

  it('shows the cautions with every result, deferring to the maker, the manual and local codes', () => {
    const text = CAUTIONS.join(' ')
    for (const topic of [/eye and hearing/, /dust extraction/, /tabs/, /unattended/, /acrylic gives off fumes/, /bit maker's data, the machine's manual and local codes govern/]) {
      expect(text).toMatch(topic)
    }
  })
})

describe('warnings, each fired and not fired at its boundary', () => {
  it('downcut or compression geometry in a plastic', () => {
    expect(codes(input({ helix: 'downcut', flutes: 2 }))).toContain('downcut_in_plastic')
    expect(codes(input({ family: 'soft_plastic', helix: 'compression', flutes: 2 }))).toContain('downcut_in_plastic')
    expect(codes(input({ family: 'foam', helix: 'downcut' }))).toContain('downcut_in_plastic')
    expect(codes(input({ helix: 'upcut' }))).not.toContain('downcut_in_plastic')
    expect(codes(input({ family: 'sheet_goods', helix: 'compression', flutes: 2 }))).not.toContain('downcut_in_plastic')
  })

  it('chip load below the family\'s minimum: equal is fine, a hair under warns', () => {
    // Middle of 0.3–0.5 is 0.4; at 2×D × 0.75 = 0.3, exactly the minimum.
    const at = input({ band: band({ chipLoadMinMm: 0.3, chipLoadMaxMm: 0.5 }), depthMm: 12.7 })
    expect(computeFeeds(at).chipLoadMm).toBeCloseTo(0.3, 9)
    expect(codes(at)).not.toContain('chip_load_low')
    const under = input({ band: band({ chipLoadMinMm: 0.3, chipLoadMaxMm: 0.499 }), depthMm: 12.7 })
    expect(codes(under)).toContain('chip_load_low')
    expect(computeFeeds(under).warnings[0]!.message).toMatch(/rubs instead of cutting.*melts plastic/)
  })

  it('spindle speed outside the machine\'s range: a target at the lowest speed is fine, one rpm under warns', () => {
    const vcFor = (rpm: number) => (rpm * Math.PI * 6.35) / 1000
    const at = computeFeeds(input({ band: band({ surfaceSpeedMPerMin: vcFor(6000) }) }))
    expect(at).toMatchObject({ rpm: 6000, rpmClamped: null, warnings: [] })
    const under = computeFeeds(input({ band: band({ surfaceSpeedMPerMin: vcFor(5999) }) }))
    expect(under.rpm).toBe(6000)
    expect(under.warnings.map((w) => w.code)).toEqual(['spindle_out_of_range'])
    // At the top: exactly the top speed is not clamped; one above is clamped to it, with a note.
    expect(computeFeeds(input({ band: band({ surfaceSpeedMPerMin: vcFor(24000) }) })).rpmClamped).toBeNull()
    expect(computeFeeds(input({ band: band({ surfaceSpeedMPerMin: vcFor(24001) }) }))).toMatchObject({ rpm: 24000, rpmClamped: 'max' })
  })

  it('a bit past the shop\'s due mark in a hard plastic', () => {
    expect(codes(input({ lifeUsed: 0.9, lifeThreshold: 0.9 }))).toContain('dull_in_hard_plastic')
    expect(codes(input({ lifeUsed: 0.899, lifeThreshold: 0.9 }))).not.toContain('dull_in_hard_plastic')
    expect(codes(input({ family: 'soft_plastic', lifeUsed: 1.2, lifeThreshold: 0.9 }))).not.toContain('dull_in_hard_plastic')
    expect(codes(input({ lifeUsed: null, lifeThreshold: 0.9 }))).not.toContain('dull_in_hard_plastic')
  })

  it('a two-flute bit in plastic when a single-flute bit of its diameter is in the crib', () => {
    const alt = { typeName: 'O-flute upcut 1/4"' }
    expect(codes(input({ flutes: 2, singleFluteInCrib: alt }))).toContain('single_flute_in_crib')
    expect(codes(input({ flutes: 1, singleFluteInCrib: alt }))).not.toContain('single_flute_in_crib')
    expect(codes(input({ flutes: 2, singleFluteInCrib: null }))).not.toContain('single_flute_in_crib')
    expect(codes(input({ family: 'wood', flutes: 2, singleFluteInCrib: alt }))).not.toContain('single_flute_in_crib')
  })
})

describe('the ordering facts of the trade (common practice, docs/domain.md computation 5)', () => {
  it('single-flute upcut geometry is preferred in plastics', () => {
    // Common practice: a single-flute upcut (O-flute) lifts chips out; downcut and compression pack them in.
    const single = plasticGeometryRank({ flutes: 1, helix: 'upcut' })
    expect(single).toBeLessThan(plasticGeometryRank({ flutes: 2, helix: 'upcut' }))
    expect(plasticGeometryRank({ flutes: 2, helix: 'upcut' })).toBeLessThan(plasticGeometryRank({ flutes: 2, helix: 'downcut' }))
    expect(plasticGeometryRank({ flutes: 2, helix: 'upcut' })).toBeLessThan(plasticGeometryRank({ flutes: 2, helix: 'compression' }))
    // At the same rpm and feed one flute cuts a chip twice as thick, which carries the heat away.
    expect(chipLoadOf(3000, 18000, 1)).toBeCloseTo(2 * chipLoadOf(3000, 18000, 2), 12)
    expect(computeFeeds(input({ flutes: 1, helix: 'upcut' })).warnings).toEqual([])
  })

  it('soft plastics take a higher feed than hard plastics for the same bit', () => {
    // Common practice, through the starting table: every diameter band, same bit and machine.
    for (const d of [3.175, 6.35, 9.525, 12.7]) {
      const soft = computeFeeds(input({ family: 'soft_plastic', diameterMm: d, band: starting('soft_plastic', d) }))
      const hard = computeFeeds(input({ family: 'hard_plastic', diameterMm: d, band: starting('hard_plastic', d) }))
      expect(soft.rpm).toBe(hard.rpm)
      expect(soft.feedMmPerMin).toBeGreaterThan(hard.feedMmPerMin)
    }
  })
})
