// Life used by linear damage accumulation (Palmgren–Miner): each cut uses
// minutes × wear factor / (rated life × life scale) of the cutter's current sharp life.
// Pure: no framework or database imports.

/** The share of a sharp life that one cut uses. `lifeScale` is 1 for a new cutter and the
 *  shop's regrind life fraction for a reground one. */
export function lifeAdded(minutes: number, wearFactor: number, ratedLifeMinutes: number, lifeScale = 1): number {
  if (!(minutes >= 0) || !(wearFactor > 0) || !(ratedLifeMinutes > 0) || !(lifeScale > 0)) {
    throw new RangeError('lifeAdded needs minutes ≥ 0 and a positive wear factor, rated life and life scale')
  }
  return (minutes * wearFactor) / (ratedLifeMinutes * lifeScale)
}

export interface CutForLife { minutes: number, wearFactor: number }

/** Life used after a series of cuts, summed cut by cut (the order does not matter). */
export function lifeUsed(cuts: readonly CutForLife[], ratedLifeMinutes: number, lifeScale = 1): number {
  return cuts.reduce((sum, cut) => sum + lifeAdded(cut.minutes, cut.wearFactor, ratedLifeMinutes, lifeScale), 0)
}

/** Minutes left in one material before the current sharp life is used up; never negative. */
export function remainingMinutes(used: number, ratedLifeMinutes: number, wearFactor: number, lifeScale = 1): number {
  return (Math.max(0, 1 - used) * ratedLifeMinutes * lifeScale) / wearFactor
}

/** A material as the remaining minutes are worked out for it. */
export interface MaterialForRemaining { id: number, name: string, common: boolean, wearFactor: number }

/**
 * Minutes left in each material, rounded to a tenth of a minute: what every cutter view shows
 * (the server's, the phone's copy, and the phone's view updated by a cut's answer), worked out here
 * once. Each entry keeps its material's wear factor, so the figures can be worked out again when
 * the life used changes.
 */
export function remainingInMaterials(materials: readonly MaterialForRemaining[], used: number, ratedLifeMinutes: number, lifeScale = 1) {
  return materials.map((m) => ({
    materialId: m.id, materialName: m.name, common: m.common, wearFactor: m.wearFactor,
    minutes: Math.round(remainingMinutes(used, ratedLifeMinutes, m.wearFactor, lifeScale) * 10) / 10,
  }))
}

/** Rounds a life fraction the way the database stores it (numeric(10,6)). */
export function roundLife(value: number): number {
  return Math.round(value * 1e6) / 1e6
}

/** How a life bar shows a cutter: short of the shop's resharpen mark, at or past it, past a whole life. */
export type LifeTone = 'ok' | 'due' | 'past'

/** Whole percent of a sharp life used, rounded down, so the figure never reads as the mark before the tone does. */
export function lifePercent(fraction: number): number {
  return Math.floor(Math.max(0, fraction) * 100 + 1e-9)
}

/** The tone of a life bar: 'due' from the shop's threshold on, 'past' only beyond a whole life. */
export function lifeTone(used: number, threshold: number): LifeTone {
  return used > 1 ? 'past' : used >= threshold ? 'due' : 'ok'
}
