// The check before the job, each warning at its boundary: life left by Palmgren-Miner linear
// damage ((1 - used) x rated life x life scale / wear factor), the programmed chip load
// fz = vf / (n z) (Groover, Fundamentals of Modern Manufacturing, milling relations) against the
// shop's chip-load row (common-practice router ranges), downcut geometry in plastic (common
// practice), the machine's spindle range, depth against cutting length, pockets and the tool map.
import { describe, expect, it } from 'vitest'
import type { ChipLoadBand } from '../../shared/kerf/chip-loads'
import { checkProgram, type CheckInput, type PocketCutter } from '../../shared/kerf/nc/check'
import { jobCostRows } from '../../shared/kerf/nc/job-cost'
import { MM_PER_INCH } from '../../shared/kerf/units'

// Cast acrylic, 1/4 in bit: 0.005 to 0.009 in a tooth (common practice, REFERENCES-style table).
const ACRYLIC_QUARTER: ChipLoadBand = {
  family: 'hard_plastic', diameterMinMm: 4.7625, diameterMaxMm: 7.9375, chipLoadMinMm: 0.005 * MM_PER_INCH, chipLoadMaxMm: 0.009 * MM_PER_INCH,
  surfaceSpeedMPerMin: null, plungeFraction: null, depthPerPassFactor: null, source: 'common practice',
}
const cutter = (over: Partial<PocketCutter> = {}): PocketCutter => ({
  id: 1, code: 'AAAA111', typeId: 7, typeName: 'O-flute 1/4"', diameterMm: 6.35, flutes: 1, helix: 'upcut', cuttingLengthMm: 22,
  ratedLifeMinutes: 600, lifeScale: 1, lifeUsed: 0.2, flagged: null, ...over,
})
const input = (over: Partial<CheckInput> = {}): CheckInput => ({
  tools: [{ tool: 1, estimatedMinutes: 10, maxDepthMm: 6, spindleRpm: [18000], feedsMmPerMin: [600, 3000] }],
  repeats: 2,
  machine: { name: 'Router', minRpm: 6000, maxRpm: 24000, pockets: 8 },
  toolMap: new Map(),
  pockets: new Map([[1, cutter()]]),
  material: { name: 'Cast acrylic', family: 'hard_plastic', wearFactor: 0.9 },
  chipLoads: [ACRYLIC_QUARTER],
  lifeThreshold: 0.9,
  spares: new Map([[7, ['BBBB222']]]),
  ...over,
})
const codes = (i: CheckInput) => checkProgram(i)[0]!.warnings.map((w) => w.code)

describe('the check before the job', () => {
  it('a sharp upcut at a chip load inside the row has no warnings', () => {
    // 3000 mm/min ÷ (18000 rpm × 1 flute) = 0.1667 mm, inside 0.127 to 0.2286 mm [computed].
    const [t] = checkProgram(input())
    expect(t!.warnings).toEqual([])
    expect(t!.cutter!.chipLoadMm).toBeCloseTo(3000 / 18000, 12)
    expect(t!.minutesNeeded).toBe(20)
    // (1 − 0.2) × 600 / 0.9 = 533.33 min [computed].
    expect(t!.cutter!.lifeLeftMinutes).toBeCloseTo(533.333, 3)
  })
  it('not enough life names the sharp spares of the type; the boundary is the minutes needed', () => {
    // Life left (1 − u) × 600 / 0.9 = 20 min at u = 0.97.
    expect(codes(input({ pockets: new Map([[1, cutter({ lifeUsed: 0.97 - 1e-9 })]]) }))).not.toContain('not_enough_life')
    const w = checkProgram(input({ pockets: new Map([[1, cutter({ lifeUsed: 0.975 })]]) }))[0]!.warnings
    expect(w.find((x) => x.code === 'not_enough_life')!.message).toBe('AAAA111 has about 16.7 min of life left in Cast acrylic; this job needs 20 min. Sharp O-flute 1/4" in the crib: BBBB222.')
    expect(w.map((x) => x.code)).toContain('due')
  })
  it('a dull bit: flagged, or at the resharpen mark', () => {
    expect(codes(input({ pockets: new Map([[1, cutter({ flagged: 'dull' })]]) }))).toContain('flagged_dull')
    expect(codes(input({ pockets: new Map([[1, cutter({ lifeUsed: 0.9 })]]) }))).toContain('due')
    expect(codes(input({ pockets: new Map([[1, cutter({ lifeUsed: 0.899 })]]) }))).not.toContain('due')
  })
  it('a downcut or compression bit in plastic, not in wood', () => {
    expect(codes(input({ pockets: new Map([[1, cutter({ helix: 'downcut' })]]) }))).toContain('downcut_in_plastic')
    expect(codes(input({ pockets: new Map([[1, cutter({ helix: 'compression' })]]) }))).toContain('downcut_in_plastic')
    expect(codes(input({ pockets: new Map([[1, cutter({ helix: 'downcut' })]]), material: { name: 'MDF', family: 'sheet_goods', wearFactor: 1 } }))).not.toContain('downcut_in_plastic')
  })
  it('programmed chip load below and above the shop\'s row', () => {
    // Low: 2000 / 18000 = 0.111 mm < 0.127; high: 4200 / 18000 = 0.233 mm > 0.2286 [computed].
    expect(codes(input({ tools: [{ tool: 1, estimatedMinutes: 1, maxDepthMm: 1, spindleRpm: [18000], feedsMmPerMin: [2000] }] }))).toContain('chip_load_low')
    expect(codes(input({ tools: [{ tool: 1, estimatedMinutes: 1, maxDepthMm: 1, spindleRpm: [18000], feedsMmPerMin: [4200] }] }))).toContain('chip_load_high')
    // Two flutes halve it: 4200 / (18000 × 2) = 0.117 mm, now low.
    expect(codes(input({ tools: [{ tool: 1, estimatedMinutes: 1, maxDepthMm: 1, spindleRpm: [18000], feedsMmPerMin: [4200] }], pockets: new Map([[1, cutter({ flutes: 2 })]]) }))).toContain('chip_load_low')
  })
  it('a spindle speed outside the machine\'s range, and none at all', () => {
    expect(codes(input({ tools: [{ tool: 1, estimatedMinutes: 1, maxDepthMm: 1, spindleRpm: [25000], feedsMmPerMin: [3000] }] }))).toContain('spindle_out_of_range')
    expect(codes(input({ tools: [{ tool: 1, estimatedMinutes: 1, maxDepthMm: 1, spindleRpm: [24000], feedsMmPerMin: [4000] }] }))).not.toContain('spindle_out_of_range')
    expect(codes(input({ tools: [{ tool: 1, estimatedMinutes: 1, maxDepthMm: 1, spindleRpm: [], feedsMmPerMin: [3000] }] }))).toContain('no_spindle_speed')
  })
  it('a cut deeper than the cutting length', () => {
    expect(codes(input({ tools: [{ tool: 1, estimatedMinutes: 1, maxDepthMm: 22.001, spindleRpm: [18000], feedsMmPerMin: [3000] }] }))).toContain('too_deep')
    expect(codes(input({ tools: [{ tool: 1, estimatedMinutes: 1, maxDepthMm: 22, spindleRpm: [18000], feedsMmPerMin: [3000] }] }))).not.toContain('too_deep')
  })
  it('an empty pocket, the tool map, and a manual collet', () => {
    expect(checkProgram(input({ pockets: new Map() }))[0]).toMatchObject({ cutter: null, pocket: 1, warnings: [{ code: 'empty_pocket', message: 'Pocket 1 of Router is empty: load a cutter for T1 before the job.' }] })
    const mapped = checkProgram(input({ tools: [{ tool: 12, estimatedMinutes: 1, maxDepthMm: 1, spindleRpm: [18000], feedsMmPerMin: [3000] }], toolMap: new Map([[12, 1]]) }))[0]!
    expect(mapped).toMatchObject({ tool: 12, pocket: 1, cutter: { code: 'AAAA111' } })
    const manual = checkProgram(input({ tools: [{ tool: 5, estimatedMinutes: 1, maxDepthMm: 1, spindleRpm: [18000], feedsMmPerMin: [3000] }], machine: { name: 'Bench', minRpm: 6000, maxRpm: 24000, pockets: 0 } }))[0]!
    expect(manual.cutter!.code).toBe('AAAA111')
  })
})

describe('tooling cost per job', () => {
  it('sums each log\'s share of a life at its type\'s cost per life, per job and per sheet', () => {
    // 30 min × 0.9 / 600 = 0.045 lives × 4000 ¢ = 180 ¢; 10 min × 1.2 / 300 = 0.04 × 2500 = 100 ¢ [computed].
    const rows = jobCostRows(
      [
        { jobRef: 'A-1', typeId: 1, minutes: 30, wearFactor: 0.9, ratedLifeMinutes: 600 },
        { jobRef: 'A-1', typeId: 2, minutes: 10, wearFactor: 1.2, ratedLifeMinutes: 300 },
        { jobRef: '', typeId: 1, minutes: 6, wearFactor: 1, ratedLifeMinutes: 600 },
      ],
      new Map([['A-1', { runs: 2, sheets: 4 }], ['', { runs: 1, sheets: 1 }]]),
      new Map([[1, 4000], [2, 2500]]),
    )
    expect(rows).toEqual([
      { jobRef: 'A-1', runs: 2, sheets: 4, minutes: 40, costCents: 280, costPerSheetCents: 70 },
      { jobRef: '', runs: 1, sheets: 1, minutes: 6, costCents: 40, costPerSheetCents: 40 },
    ])
  })
})
