// Stock-outs of a cutter type, for the owner: the days (the shop's, by `dayOf`) on which the type had no sharp
// cutter (none in the crib or a spindle) at some moment while cuts in its materials were
// logged that day. Rebuilt from the cutters' changes of state. Pure.

const SHARP = new Set(['in_crib', 'in_spindle'])
const DAY_MS = 86_400_000

export interface StateChange {
  at: Date
  from: string | null
  to: string | null
}

/** +1 when a change brings a cutter into the crib or a spindle, −1 when it takes one out. */
export function sharpDelta(change: Pick<StateChange, 'from' | 'to'>): number {
  return Number(change.to !== null && SHARP.has(change.to)) - Number(change.from !== null && SHARP.has(change.from))
}

export const utcDay = (d: Date) => Math.floor(d.getTime() / DAY_MS)

/**
 * The days in [fromDay, toDay] (day numbers, as `dayOf` counts them: UTC unless the shop's) on
 * which the count of sharp cutters was 0 at some moment, from every change of the type's cutters
 * since the first (oldest first or not).
 */
export function daysWithoutSharp(changes: readonly StateChange[], fromDay: number, toDay: number, dayOf: (at: Date) => number = utcDay): Set<number> {
  const sorted = [...changes].sort((a, b) => a.at.getTime() - b.at.getTime())
  const empty = new Set<number>()
  let count = 0
  let day = fromDay
  let i = 0
  // The count as the range starts.
  while (i < sorted.length && dayOf(sorted[i]!.at) < fromDay) count += sharpDelta(sorted[i++]!)
  for (; day <= toDay; day++) {
    let lowest = count
    while (i < sorted.length && dayOf(sorted[i]!.at) === day) {
      count += sharpDelta(sorted[i++]!)
      lowest = Math.min(lowest, count)
    }
    if (lowest <= 0) empty.add(day)
  }
  return empty
}

/** Stock-out days: days without a sharp cutter on which its materials were cut. */
export function stockOutDays(changes: readonly StateChange[], cuttingDays: ReadonlySet<number>, fromDay: number, toDay: number, dayOf: (at: Date) => number = utcDay): number {
  let n = 0
  for (const day of daysWithoutSharp(changes, fromDay, toDay, dayOf)) if (cuttingDays.has(day)) n++
  return n
}
