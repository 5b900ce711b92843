// Reordering checked against textbook worked examples and an independent statistics library.
import quantile from '@stdlib/stats-base-dists-normal-quantile'
import { describe, expect, it } from 'vitest'
import {
  dailyStats, economicOrderQuantity, livesPerCutter, reorderFigures, reorderPoint, roundUpToPack, safetyStock, serviceZ,
} from '../../shared/kerf/reorder'

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

describe('a cutter type\'s reorder figures', () => {
  const base = {
    maxRegrinds: 2, regrindLifeFraction: 0.8, serviceLevel: 0.95, leadTimeDays: 7, unitCostCents: 4000, packSize: 2,
    orderCostCents: 2500, holdingRate: 0.25, available: 3, onOrder: 0,
  }

  it('counts demand in cutters: each cutter gives 1 + regrinds × fraction lives', () => {
    expect(livesPerCutter(2, 0.8)).toBeCloseTo(2.6, 12)
    // 2.6 lives a day for 90 days is one cutter a day, with no spread.
    const f = reorderFigures({ ...base, dailyLives: Array(90).fill(2.6) })
    expect(f.dailyDemand).toBeCloseTo(1, 12)
    expect(f.safetyStock).toBeCloseTo(0, 12)
    expect(f.reorderPoint).toBeCloseTo(7, 9)
    // EOQ = √(2 · 365 · 2500 / (4000 · 0.25)) = √1825 ≈ 42.7 → 44 in packs of two.
    expect(f.economicOrderQuantity).toBeCloseTo(Math.sqrt(1825), 9)
    expect(f.suggestedQty).toBe(44)
  })

  it('a type that costs nothing to hold (unit cost 0) has no EOQ: the suggestion is the shortfall in packs', () => {
    // One cutter a day, reorder point 7, 3 in stock: short by 4, two packs of two.
    const free = reorderFigures({ ...base, unitCostCents: 0, dailyLives: Array(90).fill(2.6) })
    expect(free.economicOrderQuantity).toBe(0)
    expect(free.suggestedQty).toBe(4)
  })

  it('open orders count as stock', () => {
    const lives = Array(90).fill(2.6) // one cutter a day, reorder point 7
    expect(reorderFigures({ ...base, dailyLives: lives, available: 3, onOrder: 0 }).belowReorderPoint).toBe(true)
    const covered = reorderFigures({ ...base, dailyLives: lives, available: 3, onOrder: 5 })
    expect(covered.position).toBe(8)
    expect(covered.belowReorderPoint).toBe(false)
    expect(covered.suggestedQty).toBe(0)
  })

  it('a type nobody used suggests nothing', () => {
    const idle = reorderFigures({ ...base, dailyLives: Array(90).fill(0), available: 0 })
    expect(idle.dailyDemand).toBe(0)
    expect(idle.suggestedQty).toBe(0)
  })

  it('more day-to-day spread means more safety stock', () => {
    const steady = reorderFigures({ ...base, dailyLives: Array(90).fill(1.3) })
    const lumpy = reorderFigures({ ...base, dailyLives: Array.from({ length: 90 }, (_, i) => (i % 2 ? 2.6 : 0)) })
    expect(lumpy.dailyDemand).toBeCloseTo(steady.dailyDemand, 9)
    expect(lumpy.safetyStock).toBeGreaterThan(steady.safetyStock)
  })
})
