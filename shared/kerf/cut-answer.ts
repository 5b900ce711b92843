// What a logged cut changes in the cutter as its page shows it. The cut's answer carries the
// cutter's new state (totals, status, what is due) and the log as the list shows it, not the whole
// view again: the shop's materials and the earlier logs are already on the page, and reading them
// with every log doubled what a log cost the server. The page puts the two together here. Pure.
import { remainingInMaterials } from './life'

/** How many of its latest counting logs the cutter view shows. */
export const RECENT_CUTS = 5

interface Remaining { materialId: number, materialName: string, common: boolean, wearFactor: number, minutes: number }
interface ListedCut { id: number | string, cutAt: Date | string }
interface CutterViewLike {
  id: number
  lifeUsed: number
  lifeScale: number
  type: { ratedLifeMinutes: number }
  remainingMinutes: Remaining[]
  recentCuts: ListedCut[]
}
/** Recent cuts in the view's order: by cut time, then by id, newest first. */
export function newestCutFirst(a: ListedCut, b: ListedCut): number {
  return new Date(b.cutAt).getTime() - new Date(a.cutAt).getTime() || Number(b.id) - Number(a.id)
}

/**
 * The view with a cut's answer put in: the answer's state, the remaining minutes in each material
 * worked out again for the new life used, and the answer's logs among the recent ones (a log
 * already listed is replaced, so an answer that comes twice changes nothing).
 */
export function withLoggedCut<V extends CutterViewLike>(view: V, change: Omit<V, 'remainingMinutes'>): V {
  const byId = new Map(view.recentCuts.map((c) => [c.id, c]))
  for (const c of change.recentCuts) byId.set(c.id, c)
  const materials = view.remainingMinutes.map((m) => ({ id: m.materialId, name: m.materialName, common: m.common, wearFactor: m.wearFactor }))
  return {
    ...view,
    ...change,
    remainingMinutes: remainingInMaterials(materials, change.lifeUsed, change.type.ratedLifeMinutes, change.lifeScale),
    recentCuts: [...byId.values()].sort(newestCutFirst).slice(0, RECENT_CUTS) as V['recentCuts'],
  }
}
