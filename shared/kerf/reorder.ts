// Reordering (DESIGN.md computation 3): demand in cutters per day from measured life
// consumption; the reorder point over the lead time from Poisson demand for slow movers (the
// usual case for router bits) and the normal approximation for faster ones; the shop's own
// min/max or spares per machine when set; an order-up-to level over the lead time plus the
// review interval, in whole packs, or the economic order quantity where larger. Pure: no
// framework or database imports.
import jstat from 'jstat'

// jStat is CommonJS: Node's ESM loader only offers its default export.
const { jStat } = jstat

/** Service level → z, the standard normal quantile (e.g. 0.95 → 1.645). */
export function serviceZ(serviceLevel: number): number {
  if (!(serviceLevel > 0 && serviceLevel < 1)) throw new RangeError('service level must be between 0 and 1')
  // The quantile of 0.5 comes back as about -8e-17, which a page shows as "-0.0": the median is 0.
  const z = jStat.normal.inv(serviceLevel, 0, 1)
  return Math.abs(z) < 1e-12 ? 0 : z
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

/** Above this many cutters expected over the lead time, the normal approximation decides;
 *  at or below it, the Poisson distribution (exact for demand that comes one cutter at a time
 *  at random). At a mean of 20 the two reorder points differ by at most one cutter. */
export const POISSON_MAX_MEAN = 20

/** P(D ≤ k) for Poisson demand with mean λ, summed term by term (no library: tests check it
 *  against jStat and @stdlib). */
export function poissonCdf(k: number, mean: number): number {
  if (k < 0) return 0
  if (mean <= 0) return 1
  let term = Math.exp(-mean)
  let sum = term
  for (let i = 1; i <= Math.floor(k); i++) {
    term *= mean / i
    sum += term
    if (term < 1e-17 && i > mean) break
  }
  return Math.min(1, sum)
}

/** The smallest whole s with P(D ≤ s) ≥ the service level, D Poisson with the given mean. */
export function poissonReorderPoint(mean: number, serviceLevel: number): number {
  if (!(serviceLevel > 0 && serviceLevel < 1)) throw new RangeError('service level must be between 0 and 1')
  if (mean <= 0) return 0
  let s = 0
  // Tolerance: a cumulative probability that equals the level up to rounding meets it.
  while (poissonCdf(s, mean) < serviceLevel - 1e-12) s++
  return s
}

/** Standard normal cumulative probability (for the chance of running out in the normal regime). */
function normalCdf(x: number): number {
  return jStat.normal.cdf(x, 0, 1)
}

export type ReorderMethod = 'poisson' | 'normal' | 'min_max' | 'spares'

export interface ReorderInput {
  /** Lives consumed on each of the last `days` days, oldest first (0 for a quiet day). */
  dailyLives: readonly number[]
  maxRegrinds: number
  regrindLifeFraction: number
  serviceLevel: number
  leadTimeDays: number
  /** Days between two looks at the stock (the order must last until the next look's delivery). */
  reviewDays?: number
  unitCostCents: number
  packSize: number
  orderCostCents: number
  /** Yearly holding cost as a fraction of the unit cost. */
  holdingRate: number
  /** Cutters in the crib and in spindles with life left. */
  available: number
  /** Cutters on open purchase orders, not yet received. */
  onOrder: number
  /** Cutters out at the regrinder, expected back within the lead time: stock that comes back. */
  atRegrind?: number
  /** The shop's own minimum and maximum on hand, when set. */
  minOnHand?: number | null
  maxOnHand?: number | null
  /** Sharp spares each machine using the type should have waiting, when set. */
  sparesPerMachine?: number | null
  /** Machines that use the type (cut with it lately or hold one now). */
  machinesUsing?: number
  doNotReorder?: boolean
}

export interface ReorderFigures {
  livesPerCutter: number
  dailyDemand: number
  sdDailyDemand: number
  z: number
  /** Expected cutters used over the lead time. */
  leadTimeDemand: number
  safetyStock: number
  /** Whole cutters: order when the position is at or below it. */
  reorderPoint: number
  /** Whole cutters the position is brought up to (always above the reorder point). */
  orderUpTo: number
  economicOrderQuantity: number
  method: ReorderMethod
  /** The shop's own target when min/max or spares decide: keep at least this many. */
  keepAtLeast: number | null
  atRegrind: number
  position: number
  belowReorderPoint: boolean
  suggestedQty: number
  /** Chance that demand over the lead time is more than the position: running out before a delivery. */
  riskWithoutOrder: number
}

function statisticalPoint(mean: number, sd: number, z: number, serviceLevel: number, days: number) {
  const expected = mean * days
  if (expected <= POISSON_MAX_MEAN) return { method: 'poisson' as const, point: poissonReorderPoint(expected, serviceLevel), safety: 0 }
  const safety = safetyStock(z, sd, days)
  // Whole cutters: the continuous figure rounded up (a stored epsilon keeps 7.0000000001 at 7).
  return { method: 'normal' as const, point: Math.ceil(reorderPoint(mean, days, safety) - 1e-9), safety }
}

function runOutRisk(method: ReorderMethod, mean: number, sd: number, days: number, position: number): number {
  const expected = mean * days
  if (expected <= 0) return 0
  if (method === 'poisson' || expected <= POISSON_MAX_MEAN) return 1 - poissonCdf(position, expected)
  const spread = sd * Math.sqrt(days)
  if (spread <= 0) return position < expected ? 1 : 0
  return 1 - normalCdf((position - expected) / spread)
}

/** Every figure behind a reorder suggestion for one cutter type. */
export function reorderFigures(input: ReorderInput): ReorderFigures {
  const lives = livesPerCutter(input.maxRegrinds, input.regrindLifeFraction)
  const { mean, sd } = dailyStats(input.dailyLives.map((l) => l / lives))
  const z = serviceZ(input.serviceLevel)
  const lead = input.leadTimeDays
  const cover = lead + (input.reviewDays ?? 0)
  const atLead = statisticalPoint(mean, sd, z, input.serviceLevel, lead)
  const upTo = statisticalPoint(mean, sd, z, input.serviceLevel, cover)
  // A type that costs nothing to hold (unit cost 0, such as free samples) has no economic order
  // quantity: the suggestion is then the order-up-to level alone.
  const holding = input.unitCostCents * input.holdingRate
  const eoq = holding > 0 ? economicOrderQuantity(mean * 365, input.orderCostCents, holding) : 0
  const atRegrind = input.atRegrind ?? 0
  const position = input.available + input.onOrder + atRegrind

  let method: ReorderMethod = atLead.method
  let rop = atLead.point
  let target = upTo.point
  let keepAtLeast: number | null = null
  let needed = mean > 0
  const hasMinMax = input.minOnHand != null || input.maxOnHand != null
  const sparesNeed = input.sparesPerMachine != null ? (input.machinesUsing ?? 0) * (input.sparesPerMachine + 1) : null
  if (hasMinMax || sparesNeed !== null) {
    // The shop's own word: keep at least `keep` (order when fewer), up to the maximum if set.
    const min = input.minOnHand ?? null
    const useSpares = sparesNeed !== null && (min === null || sparesNeed > min)
    method = useSpares ? 'spares' : 'min_max'
    const keep = useSpares ? sparesNeed : min
    if (keep !== null) {
      keepAtLeast = keep
      rop = keep - 1
      target = Math.max(keep, input.maxOnHand ?? keep)
    } else {
      // Only a maximum: the statistics say when, the maximum says how many.
      rop = Math.min(rop, input.maxOnHand! - 1)
      target = input.maxOnHand!
    }
    needed = true
  }
  // After ordering, the position must be above the reorder point, or the next look would
  // suggest another order for the same need.
  target = Math.max(target, rop + 1)
  const below = !input.doNotReorder && needed && position <= rop
  // The shop's own maximum caps the order; the EOQ only raises it where no maximum is set.
  const wanted = target - position
  const qty = method === 'min_max' || method === 'spares' ? wanted : Math.max(wanted, eoq)
  const suggested = below ? roundUpToPack(Math.max(qty, 1), input.packSize) : 0
  return {
    livesPerCutter: lives,
    dailyDemand: mean,
    sdDailyDemand: sd,
    z,
    leadTimeDemand: mean * lead,
    safetyStock: atLead.safety,
    reorderPoint: rop,
    orderUpTo: target,
    economicOrderQuantity: eoq,
    method,
    keepAtLeast,
    atRegrind,
    position,
    belowReorderPoint: below,
    suggestedQty: suggested,
    riskWithoutOrder: runOutRisk(atLead.method, mean, sd, lead, position),
  }
}
