// Reordering (docs/domain.md, computation 3): demand in cutters per day from measured life
// consumption, safety stock and reorder point over the lead time, and the economic order
// quantity rounded up to the pack size. Pure: no framework or database imports.
import jstat from 'jstat'

// jStat is CommonJS: Node's ESM loader only offers its default export.
const { jStat } = jstat

/** Service level → z, the standard normal quantile (e.g. 0.95 → 1.645). */
export function serviceZ(serviceLevel: number): number {
  if (!(serviceLevel > 0 && serviceLevel < 1)) throw new RangeError('service level must be between 0 and 1')
  return jStat.normal.inv(serviceLevel, 0, 1)
}

/** Sharp lives one cutter gives: its first life and each allowed regrind's shorter one. */
export function livesPerCutter(maxRegrinds: number, regrindLifeFraction: number): number {
  return 1 + maxRegrinds * regrindLifeFraction
}

/** Mean and sample standard deviation of a daily series (days with no use count as 0). */
export function dailyStats(values: readonly number[]): { mean: number, sd: number } {
  const n = values.length
  if (n === 0) return { mean: 0, sd: 0 }
  const mean = values.reduce((a, b) => a + b, 0) / n
  if (n < 2) return { mean, sd: 0 }
  const variance = values.reduce((a, v) => a + (v - mean) ** 2, 0) / (n - 1)
  return { mean, sd: Math.sqrt(variance) }
}

/** Safety stock = z · σ_d · √L. */
export function safetyStock(z: number, sdDaily: number, leadTimeDays: number): number {
  return z * sdDaily * Math.sqrt(leadTimeDays)
}

/** Reorder point = d̄ · L + safety stock. */
export function reorderPoint(meanDaily: number, leadTimeDays: number, safety: number): number {
  return meanDaily * leadTimeDays + safety
}

/** Economic order quantity Q* = √(2DS/H): D yearly demand, S cost per order, H yearly holding cost per unit. */
export function economicOrderQuantity(annualDemand: number, orderCost: number, holdingCostPerUnitYear: number): number {
  if (annualDemand <= 0) return 0
  if (!(holdingCostPerUnitYear > 0)) throw new RangeError('holding cost must be positive')
  return Math.sqrt((2 * annualDemand * orderCost) / holdingCostPerUnitYear)
}

export function roundUpToPack(quantity: number, packSize: number): number {
  if (quantity <= 0) return 0
  return Math.ceil(quantity / packSize - 1e-9) * packSize
}

export interface ReorderInput {
  /** Lives consumed on each of the last `days` days, oldest first (0 for a quiet day). */
  dailyLives: readonly number[]
  maxRegrinds: number
  regrindLifeFraction: number
  serviceLevel: number
  leadTimeDays: number
  unitCostCents: number
  packSize: number
  orderCostCents: number
  /** Yearly holding cost as a fraction of the unit cost. */
  holdingRate: number
  /** Cutters in the crib and in spindles with life left. */
  available: number
  /** Cutters on open purchase orders, not yet received. */
  onOrder: number
}

export interface ReorderFigures {
  livesPerCutter: number
  dailyDemand: number
  sdDailyDemand: number
  z: number
  safetyStock: number
  reorderPoint: number
  economicOrderQuantity: number
  position: number
  belowReorderPoint: boolean
  suggestedQty: number
}

/** Every figure behind a reorder suggestion for one cutter type. */
export function reorderFigures(input: ReorderInput): ReorderFigures {
  const lives = livesPerCutter(input.maxRegrinds, input.regrindLifeFraction)
  const { mean, sd } = dailyStats(input.dailyLives.map((l) => l / lives))
  const z = serviceZ(input.serviceLevel)
  const safety = safetyStock(z, sd, input.leadTimeDays)
  const rop = reorderPoint(mean, input.leadTimeDays, safety)
  // A type that costs nothing to hold (unit cost 0, such as free samples) has no economic order
  // quantity: the suggestion is then the shortfall alone.
  const holding = input.unitCostCents * input.holdingRate
  const eoq = holding > 0 ? economicOrderQuantity(mean * 365, input.orderCostCents, holding) : 0
  const position = input.available + input.onOrder
  const below = mean > 0 && position <= rop
  // Order enough to bring the position back above the reorder point, and at least the EOQ.
  const suggested = below ? roundUpToPack(Math.max(eoq, rop - position, 1), input.packSize) : 0
  return {
    livesPerCutter: lives,
    dailyDemand: mean,
    sdDailyDemand: sd,
    z,
    safetyStock: safety,
    reorderPoint: rop,
    economicOrderQuantity: eoq,
    position,
    belowReorderPoint: below,
    suggestedQty: suggested,
  }
}
