// Tooling cost per life and per cut-hour, checked against an example worked by hand.
import { describe, expect, it } from 'vitest'
import { cleanupCentsPerPart, costPerCutHourCents, costPerLifeCents, costRows, cutCostCents, rate } from '../../shared/kerf/cost'

// A $40.00 cutter, $10.00 a regrind, at most 2 regrinds, reground lives 0.8 of a new one:
// 1 + 2 × 0.8 = 2.6 lives for $40 + 2 × $10 = $60, so one life costs 6000 / 2.6 = 2307.69 cents.
const TYPE = { unitCostCents: 4000, regrindCostCents: 1000, maxRegrinds: 2 }

describe('cost of a sharp life', () => {
  it('spreads purchase and regrinds over the lives a cutter gives', () => {
    expect(costPerLifeCents(TYPE, 0.8)).toBeCloseTo(6000 / 2.6, 9)
    expect(costPerLifeCents({ ...TYPE, maxRegrinds: 0 }, 0.8)).toBe(4000)
  })

  it('a whole career of cutting costs exactly the purchase and the regrinds', () => {
    const perLife = costPerLifeCents(TYPE, 0.8)
    // New life: 600 min in the reference material at rated 600; each reground life 480 min.
    const career = [600, 480, 480].reduce((sum, minutes) => sum + cutCostCents(minutes, 1, 600, perLife), 0)
    expect(career).toBeCloseTo(6000, 9)
  })
})

describe('cost per cut-hour', () => {
  it('matches the hand-computed example', () => {
    // 120 min in a material of wear 1.5 with a rated life of 600 min uses 120 × 1.5 / 600 = 0.3
    // lives: 0.3 × 2307.69 = 692.31 cents over 2 hours = 346.15 cents an hour.
    const perLife = costPerLifeCents(TYPE, 0.8)
    const cents = cutCostCents(120, 1.5, 600, perLife)
    expect(cents).toBeCloseTo(692.3077, 3)
    expect(costPerCutHourCents(cents, 120)).toBeCloseTo(346.1538, 3)
    expect(costPerCutHourCents(0, 0)).toBeNull()
  })

  it('adds slices by key, each priced at its own type, dearest hour first', () => {
    // Acrylic: 120 min on type 1 (0.3 lives × 2307.69 = 692.31) + 60 min on type 2 (0.1 lives × 2000 = 200)
    //   = 892.31 cents over 3 h = 297.44 an hour. MDF: 180 min on type 2 (0.3 lives × 2000 = 600) over 3 h = 200.
    const prices = new Map([[1, costPerLifeCents(TYPE, 0.8)], [2, 2000]])
    const rows = costRows([
      { key: 'mdf', name: 'MDF', typeId: 2, minutes: 180, newLives: 0.3 },
      { key: 'acr', name: 'Cast acrylic', typeId: 1, minutes: 120, newLives: 0.3 },
      { key: 'acr', name: 'Cast acrylic', typeId: 2, minutes: 60, newLives: 0.1 },
    ], prices)
    expect(rows).toEqual([
      { key: 'acr', name: 'Cast acrylic', cutHours: 3, toolingCostCents: 892, costPerCutHourCents: 297 },
      { key: 'mdf', name: 'MDF', cutHours: 3, toolingCostCents: 600, costPerCutHourCents: 200 },
    ])
  })

  it('a rate with no logs is no rate', () => {
    expect(rate(1, 4)).toBe(0.25)
    expect(rate(0, 0)).toBeNull()
  })
})

describe('cleanup in money', () => {
  it('prices minutes per part at the labour rate, worked by hand', () => {
    // 10 min a part at $42.00 an hour: 10 / 60 × 4200 = 700 cents. 2.5 min at $37.50: 156.25, rounded to 156.
    expect(cleanupCentsPerPart(10, 4200)).toBe(700)
    expect(cleanupCentsPerPart(2.5, 3750)).toBe(156)
    expect(cleanupCentsPerPart(0, 4200)).toBe(0)
  })

  it('has no price without minutes or without a rate', () => {
    expect(cleanupCentsPerPart(null, 4200)).toBeNull()
    expect(cleanupCentsPerPart(10, null)).toBeNull()
  })
})
