// The reorder figures in the words a person would use, and the formulas behind them for those
// who want them. Pure.
import { POISSON_MAX_MEAN, type ReorderFigures } from './reorder'

export interface ReorderWordsInput extends Pick<ReorderFigures,
  'dailyDemand' | 'sdDailyDemand' | 'z' | 'leadTimeDemand' | 'safetyStock' | 'reorderPoint' | 'orderUpTo' | 'economicOrderQuantity'
  | 'method' | 'keepAtLeast' | 'atRegrind' | 'position' | 'belowReorderPoint' | 'suggestedQty' | 'riskWithoutOrder' | 'livesPerCutter'> {
  leadTimeDays: number
  reviewDays: number
  serviceLevel: number
  packSize: number
  available: number
  onOrder: number
  maxOnHand: number | null
  sparesPerMachine: number | null
  machinesUsing: number
  doNotReorder: boolean
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`

/** A figure for a sentence: never "-0", at most the digits asked for. */
export function plainFixed(x: number, digits: number): string {
  const text = x.toFixed(digits)
  return /^-0(?:\.0+)?$/.test(text) ? text.slice(1) : text
}

/** "about one every 9 days", "about 3 a day", "none in the last 90 days". */
export function usageWords(perDay: number): string {
  if (!(perDay > 0)) return 'Nobody has used one in the last 90 days'
  if (perDay >= 0.95) return `You use about ${Math.round(perDay)} a day`
  const every = Math.round(1 / perDay)
  if (every > 365) return 'You use fewer than one a year'
  return every === 1 ? 'You use about one a day' : `You use about one every ${every} days`
}

/** A chance as "1 in 5", "less than 1 in 100" or "almost certain". */
export function chanceWords(p: number): string {
  if (p >= 0.95) return 'an almost certain chance'
  if (p < 0.01) return 'less than a 1-in-100 chance'
  return `a 1-in-${Math.max(2, Math.round(1 / p))} chance`
}

function stockWords(r: ReorderWordsInput): string {
  const parts = [`${r.available} in the crib and spindles`]
  if (r.atRegrind) parts.push(`${r.atRegrind} coming back from the regrinder`)
  if (r.onOrder) parts.push(`${r.onOrder} on order`)
  return parts.join(', ')
}

/** One sentence a person would write about this type's stock and what to do. */
export function reorderSentence(r: ReorderWordsInput): string {
  const stock = stockWords(r)
  if (r.doNotReorder) return `Not reordered: marked "do not reorder". ${stock}.`
  let order: string
  if (r.belowReorderPoint) {
    const packs = r.suggestedQty / r.packSize
    order = `Order ${r.suggestedQty}${r.packSize > 1 ? ` (${plural(packs, 'pack')})` : ''}.`
  } else {
    order = 'Nothing to order now.'
  }
  if (r.method === 'min_max' || r.method === 'spares') {
    const why = r.method === 'spares'
      ? `${plural(r.machinesUsing, 'machine uses', 'machines use')} this type, each with one in the spindle and ${plural(r.sparesPerMachine ?? 0, 'sharp spare')} waiting`
      : r.keepAtLeast !== null ? `You keep at least ${r.keepAtLeast}${r.maxOnHand !== null ? ` and at most ${r.maxOnHand}` : ''}` : `You keep at most ${r.maxOnHand}`
    const keep = r.method === 'spares' ? `: keep ${r.keepAtLeast}` : ''
    return `${order} ${why}${keep}; ${stock}.`
  }
  const use = usageWords(r.dailyDemand)
  const delivery = `delivery takes ${plural(r.leadTimeDays, 'day')}`
  if (!(r.dailyDemand > 0)) return `${order} ${use}; ${stock}.`
  const risk = r.belowReorderPoint
    ? `Without this order there is ${chanceWords(r.riskWithoutOrder)} of running out before it arrives.`
    : `The chance of running out within one delivery time is ${chanceWords(r.riskWithoutOrder).replace(/^an? /, '')}.`
  return `${order} ${use}; ${delivery}; ${stock}. ${risk}`
}

/** The formulas behind the sentence, one a line, with this row's figures in them. */
export function reorderFormulas(r: ReorderWordsInput): string[] {
  const lines = [
    `Demand d = ${plainFixed(r.dailyDemand, 3)} cutters a day (last 90 days of life used ÷ ${plainFixed(r.livesPerCutter, 2)} lives per cutter); σ_d = ${plainFixed(r.sdDailyDemand, 3)}`,
    `Lead-time demand λ = d × L = ${plainFixed(r.dailyDemand, 3)} × ${r.leadTimeDays} = ${plainFixed(r.leadTimeDemand, 2)} cutters`,
  ]
  const level = `${plainFixed(r.serviceLevel * 100, 2).replace(/\.?0+$/, '')} %`
  if (r.method === 'poisson') {
    lines.push(`λ ≤ ${POISSON_MAX_MEAN}, so Poisson demand: reorder point s = the smallest whole s with P(D ≤ s) ≥ ${level} = ${r.reorderPoint}`)
    lines.push(`Order-up-to S: the same over L + R = ${r.leadTimeDays} + ${r.reviewDays} days, at least s + 1 = ${r.orderUpTo}`)
  } else if (r.method === 'normal') {
    lines.push(`λ > ${POISSON_MAX_MEAN}, so the normal approximation: s = ⌈d·L + z·σ_d·√L⌉ = ⌈${plainFixed(r.leadTimeDemand, 2)} + ${plainFixed(r.z, 3)} × ${plainFixed(r.sdDailyDemand, 3)} × √${r.leadTimeDays}⌉ = ${r.reorderPoint} (safety stock ${plainFixed(r.safetyStock, 2)})`)
    lines.push(`Order-up-to S = ⌈d·(L+R) + z·σ_d·√(L+R)⌉ over ${r.leadTimeDays} + ${r.reviewDays} days, at least s + 1 = ${r.orderUpTo}`)
  } else {
    lines.push(`The shop's own figures decide: order when the position is at most ${r.reorderPoint}, up to ${r.orderUpTo}`)
  }
  lines.push(`Position = in the crib and spindles + on order + back from the regrinder within the lead time = ${r.position}`)
  if (r.method === 'poisson' || r.method === 'normal') {
    lines.push(`Economic order quantity √(2DS/H) = ${plainFixed(r.economicOrderQuantity, 1)} (D yearly demand, S cost of one order, H yearly holding cost of one cutter); ordered only where larger than S − position`)
  }
  lines.push(`Quantity rounded up to whole packs of ${r.packSize}`)
  return lines
}
