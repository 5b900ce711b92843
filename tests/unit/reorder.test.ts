// Reordering checked against textbook worked examples and an independent statistics library.
import quantile from '@stdlib/stats-base-dists-normal-quantile'
import stdlibPoissonCdf from '@stdlib/stats-base-dists-poisson-cdf'
import jstat from 'jstat'
import { describe, expect, it } from 'vitest'
import {
  dailyStats, economicOrderQuantity, livesPerCutter, POISSON_MAX_MEAN, poissonCdf, poissonReorderPoint, reorderFigures, reorderPoint,
  roundUpToPack, safetyStock, serviceZ,
} from '../../shared/kerf/reorder'
import { plainFixed } from '../../shared/kerf/reorder-words'

const { jStat } = jstat

describe('z from the service level', () => {
  it('matches @stdlib\'s normal quantile, a library independent of the one the product uses', () => {
    for (const p of [0.9, 0.95, 0.975, 0.99]) expect(serviceZ(p)).toBeCloseTo(quantile(p, 0, 1), 9)
  })

  it('matches the standard normal table: 90 % 1.2815516, 95 % 1.6448536, 97.5 % 1.9599640, 99 % 2.3263479', () => {
    // Standard normal quantiles, computed values listed in the project's references.
    expect(serviceZ(0.9)).toBeCloseTo(1.2815516, 6)
    expect(serviceZ(0.95)).toBeCloseTo(1.6448536, 6)
    expect(serviceZ(0.975)).toBeCloseTo(1.959964, 6)
    expect(serviceZ(0.99)).toBeCloseTo(2.3263479, 6)
  })
})

describe('economic order quantity (Harris, 1913)', () => {
  it('Heizer & Render, Operations Management, worked example: D = 1,000, S = $10, H = $0.50 → Q* = 200', () => {
    expect(economicOrderQuantity(1000, 10, 0.5)).toBeCloseTo(200, 9)
  })

  it('the same example with D = 1,200 gives 219', () => {
    expect(Math.round(economicOrderQuantity(1200, 10, 0.5))).toBe(219)
  })

  it('is rounded up to whole packs', () => {
    expect(roundUpToPack(200, 3)).toBe(201)
    expect(roundUpToPack(200, 5)).toBe(200)
    expect(roundUpToPack(0.2, 5)).toBe(5)
    expect(roundUpToPack(0, 5)).toBe(0)
  })
})

describe('reorder point with safety stock', () => {
  it('Heizer & Render variable-demand example (from memory): d̄ = 15/day, σ = 5, L = 2 days, z = 1.28 → ROP = 39.05', () => {
    const ss = safetyStock(1.28, 5, 2)
    expect(reorderPoint(15, 2, ss)).toBeCloseTo(39.05, 2)
  })

  it('daily statistics use the sample standard deviation', () => {
    const { mean, sd } = dailyStats([2, 4, 4, 4, 5, 5, 7, 9])
    expect(mean).toBe(5)
    expect(sd).toBeCloseTo(Math.sqrt(32 / 7), 12)
  })
})

describe('a cutter type\'s reorder figures in the normal regime', () => {
  // 30 days of lead time at one cutter a day is 30 cutters over the lead time: above the
  // Poisson threshold, so the normal approximation (the textbook ROP) decides.
  const base = {
    maxRegrinds: 2, regrindLifeFraction: 0.8, serviceLevel: 0.95, leadTimeDays: 30, unitCostCents: 4000, packSize: 2,
    orderCostCents: 2500, holdingRate: 0.25, available: 3, onOrder: 0,
  }

  it('counts demand in cutters: each cutter gives 1 + regrinds × fraction lives', () => {
    expect(livesPerCutter(2, 0.8)).toBeCloseTo(2.6, 12)
    // 2.6 lives a day for 90 days is one cutter a day, with no spread.
    const f = reorderFigures({ ...base, dailyLives: Array(90).fill(2.6) })
    expect(f.dailyDemand).toBeCloseTo(1, 12)
    expect(f.method).toBe('normal')
    expect(f.safetyStock).toBeCloseTo(0, 12)
    expect(f.reorderPoint).toBe(30)
    // EOQ = √(2 · 365 · 2500 / (4000 · 0.25)) = √1825 ≈ 42.7 → 44 in packs of two.
    expect(f.economicOrderQuantity).toBeCloseTo(Math.sqrt(1825), 9)
    expect(f.suggestedQty).toBe(44)
  })

  it('a type that costs nothing to hold (unit cost 0) has no EOQ: the suggestion is the shortfall in packs', () => {
    // One cutter a day, reorder point 30, 3 in stock: up to 31 (one above the reorder point) is 28, fourteen packs of two.
    const free = reorderFigures({ ...base, unitCostCents: 0, dailyLives: Array(90).fill(2.6) })
    expect(free.economicOrderQuantity).toBe(0)
    expect(free.suggestedQty).toBe(28)
  })

  it('open orders count as stock', () => {
    const lives = Array(90).fill(2.6) // one cutter a day, reorder point 30
    expect(reorderFigures({ ...base, dailyLives: lives, available: 3, onOrder: 0 }).belowReorderPoint).toBe(true)
    const covered = reorderFigures({ ...base, dailyLives: lives, available: 3, onOrder: 28 })
    expect(covered.position).toBe(31)
    expect(covered.belowReorderPoint).toBe(false)
    expect(covered.suggestedQty).toBe(0)
  })

  it('a type nobody used suggests nothing', () => {
    const idle = reorderFigures({ ...base, dailyLives: Array(90).fill(0), available: 0 })
    expect(idle.dailyDemand).toBe(0)
    expect(idle.suggestedQty).toBe(0)
  })

  it('more day-to-day spread means more safety stock', () => {
    const steady = reorderFigures({ ...base, dailyLives: Array(90).fill(2.6) })
    const lumpy = reorderFigures({ ...base, dailyLives: Array.from({ length: 90 }, (_, i) => (i % 2 ? 5.2 : 0)) })
    expect(lumpy.dailyDemand).toBeCloseTo(steady.dailyDemand, 9)
    expect(lumpy.safetyStock).toBeGreaterThan(steady.safetyStock)
  })
})

describe('reorder point for slow movers under Poisson demand', () => {
  it('agrees with jStat\'s Poisson distribution, a library the computation does not use, on a grid', () => {
    // The smallest whole s with P(D ≤ s) ≥ α, found again from jStat.poisson.cdf for each mean and level.
    for (const mean of [0.01, 0.05, 0.08, 0.1, 0.2, 0.35, 0.5, 0.8, 1, 1.33, 2, 3, 4.5, 7, 10, 15, 20]) {
      for (const level of [0.5, 0.8, 0.9, 0.95, 0.975, 0.99, 0.999]) {
        let s = 0
        while (jStat.poisson.cdf(s, mean) < level) s++
        expect(poissonReorderPoint(mean, level), `λ = ${mean}, α = ${level}`).toBe(s)
      }
      for (let k = 0; k <= 40; k++) expect(poissonCdf(k, mean)).toBeCloseTo(jStat.poisson.cdf(k, mean), 12)
    }
  })

  it('agrees with @stdlib\'s Poisson cumulative distribution too', () => {
    for (const mean of [0.08, 1.33, 9.5, 20]) {
      for (let k = 0; k <= 40; k++) expect(poissonCdf(k, mean)).toBeCloseTo(stdlibPoissonCdf(k, mean), 12)
    }
  })

  it('worked example: λ = 2, 95 % → P(D ≤ 4) = 0.9473, P(D ≤ 5) = 0.9834, so s = 5', () => {
    // Computed from the Poisson probabilities; the method is the one of E. A. Silver, D. F. Pyke and
    // R. Peterson, Inventory Management and Production Planning and Scheduling, 3rd ed. (1998),
    // chapter on slow-moving items (from memory: the page is not cited because it was not re-read).
    expect(poissonCdf(4, 2)).toBeCloseTo(0.9473, 4)
    expect(poissonCdf(5, 2)).toBeCloseTo(0.9834, 4)
    expect(poissonReorderPoint(2, 0.95)).toBe(5)
  })

  it('a router bit used once every 10 days with a 12-day lead time... λ = 0.08: P(D = 0) = 0.9231, so s = 1 at 95 %', () => {
    // λ = 0.08 from the same reference (computed): P(D = 0) = e^-0.08 = 0.9231, P(D ≤ 1) = 0.9970.
    expect(poissonCdf(0, 0.08)).toBeCloseTo(0.9231, 4)
    expect(poissonCdf(1, 0.08)).toBeCloseTo(0.9970, 4)
    expect(poissonReorderPoint(0.08, 0.95)).toBe(1)
  })

  it('slow movers are decided by Poisson and say so; faster ones by the normal approximation', () => {
    const common = {
      maxRegrinds: 0, regrindLifeFraction: 0.8, serviceLevel: 0.95, unitCostCents: 4000, packSize: 1,
      orderCostCents: 2500, holdingRate: 0.25, available: 0, onOrder: 0,
    }
    // One cutter every 10 days over a 12-day lead time: λ = 1.2.
    const slow = reorderFigures({ ...common, leadTimeDays: 12, dailyLives: Array.from({ length: 90 }, (_, i) => (i % 10 === 0 ? 1 : 0)) })
    expect(slow.method).toBe('poisson')
    expect(slow.leadTimeDemand).toBeCloseTo(1.2, 9)
    expect(slow.reorderPoint).toBe(poissonReorderPoint(1.2, 0.95))
    expect(Number.isInteger(slow.suggestedQty)).toBe(true)
    const fast = reorderFigures({ ...common, leadTimeDays: 12, dailyLives: Array(90).fill(2) })
    expect(fast.leadTimeDemand).toBeCloseTo(24, 9)
    expect(fast.method).toBe('normal')
    expect(fast.reorderPoint).toBe(24)
    expect(POISSON_MAX_MEAN).toBe(20)
  })

  it('the chance of running out without an order is P(D > position) under the same distribution', () => {
    const f = reorderFigures({
      maxRegrinds: 0, regrindLifeFraction: 0.8, serviceLevel: 0.95, unitCostCents: 4000, packSize: 1, orderCostCents: 2500,
      holdingRate: 0.25, available: 1, onOrder: 0, leadTimeDays: 10, dailyLives: Array(90).fill(0.1),
    })
    expect(f.riskWithoutOrder).toBeCloseTo(1 - jStat.poisson.cdf(1, 1), 12)
  })
})

describe('the position, the shop\'s own word, and whole packs', () => {
  const slow = {
    maxRegrinds: 0, regrindLifeFraction: 0.8, serviceLevel: 0.95, unitCostCents: 4000, packSize: 1,
    orderCostCents: 2500, holdingRate: 0.25, available: 1, onOrder: 0, leadTimeDays: 12,
    dailyLives: Array.from({ length: 90 }, (_, i) => (i % 9 === 0 ? 1 : 0)),
  }

  it('cutters coming back from the regrinder count as stock', () => {
    const without = reorderFigures(slow)
    const withBack = reorderFigures({ ...slow, atRegrind: 2 })
    expect(withBack.position).toBe(without.position + 2)
    expect(withBack.atRegrind).toBe(2)
  })

  it('the order covers the lead time plus the review interval, in whole packs', () => {
    const f = reorderFigures({ ...slow, reviewDays: 14, packSize: 3, unitCostCents: 0 })
    expect(f.orderUpTo).toBe(Math.max(poissonReorderPoint(f.dailyDemand * 26, 0.95), f.reorderPoint + 1))
    expect(f.suggestedQty % 3).toBe(0)
    expect(f.suggestedQty).toBeGreaterThanOrEqual(f.orderUpTo - f.position)
  })

  it('the EOQ is ordered only where it is larger than the order-up-to shortfall', () => {
    const cheap = reorderFigures({ ...slow, unitCostCents: 10, reviewDays: 7 }) // cheap to hold: a large EOQ
    expect(cheap.economicOrderQuantity).toBeGreaterThan(cheap.orderUpTo - cheap.position)
    expect(cheap.suggestedQty).toBe(Math.ceil(cheap.economicOrderQuantity))
    const dear = reorderFigures({ ...slow, unitCostCents: 1_000_000, reviewDays: 7 })
    expect(dear.suggestedQty).toBe(dear.orderUpTo - dear.position)
  })

  it('min/max decide when set: order when fewer than the minimum, up to the maximum', () => {
    const f = reorderFigures({ ...slow, available: 1, minOnHand: 2, maxOnHand: 5 })
    expect(f.method).toBe('min_max')
    expect(f.belowReorderPoint).toBe(true)
    expect(f.suggestedQty).toBe(4)
    expect(reorderFigures({ ...slow, available: 2, minOnHand: 2, maxOnHand: 5 }).belowReorderPoint).toBe(false)
  })

  it('spares per machine decide when set: each machine one in the spindle and N waiting', () => {
    const f = reorderFigures({ ...slow, available: 3, sparesPerMachine: 1, machinesUsing: 2 })
    expect(f.method).toBe('spares')
    expect(f.keepAtLeast).toBe(4)
    expect(f.suggestedQty).toBe(1)
  })

  it('a type marked "do not reorder" is never suggested', () => {
    const f = reorderFigures({ ...slow, available: 0, doNotReorder: true })
    expect(f.belowReorderPoint).toBe(false)
    expect(f.suggestedQty).toBe(0)
  })
})

describe('ordering what is suggested ends the suggestion', () => {
  it('after ordering the suggested quantity, the position is above the reorder point, for every method and shortfall', () => {
    // Before the fix the shortfall alone decided, leaving the position at the reorder point, which
    // still counted as below it, so a further order was suggested the next morning.
    const base = {
      maxRegrinds: 2, regrindLifeFraction: 0.8, unitCostCents: 0, orderCostCents: 2500, holdingRate: 0.25, onOrder: 0,
    }
    const demands = [Array(90).fill(0.26), Array(90).fill(2.6), Array.from({ length: 90 }, (_, i) => (i % 2 ? 5.2 : 0))]
    for (const dailyLives of demands) {
      for (const leadTimeDays of [3, 7, 30]) {
        for (const serviceLevel of [0.5, 0.9, 0.95, 0.99]) {
          for (const extra of [{}, { minOnHand: 3, maxOnHand: 3 }, { minOnHand: 2 }, { maxOnHand: 6 }, { sparesPerMachine: 1, machinesUsing: 3 }]) {
            for (let available = 0; available < 40; available += 3) {
              const input = { ...base, ...extra, dailyLives, leadTimeDays, serviceLevel, packSize: 1, available }
              const f = reorderFigures(input)
              if (!f.belowReorderPoint) continue
              const after = reorderFigures({ ...input, onOrder: f.suggestedQty })
              expect(after.belowReorderPoint, JSON.stringify({ ...extra, leadTimeDays, serviceLevel, available })).toBe(false)
            }
          }
        }
      }
    }
  })
})

describe('a 50 % service level', () => {
  it('has z = 0 exactly, so no figure reads "-0.0"', () => {
    // The standard normal median is 0; jStat's quantile returns about -8e-17 there.
    expect(Object.is(serviceZ(0.5), 0)).toBe(true)
    const f = reorderFigures({
      maxRegrinds: 0, regrindLifeFraction: 0.8, serviceLevel: 0.5, unitCostCents: 4000, packSize: 1, orderCostCents: 2500,
      holdingRate: 0.25, available: 0, onOrder: 0, leadTimeDays: 30, dailyLives: Array.from({ length: 90 }, (_, i) => (i % 2 ? 2 : 0)),
    })
    expect(f.method).toBe('normal')
    expect(f.safetyStock.toFixed(1)).toBe('0.0')
    expect(plainFixed(-1e-17, 1)).toBe('0.0')
  })
})
