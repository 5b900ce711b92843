// One cutter as its page shows it (GET /api/cutters/by-code/:code), and the lists the page's
// forms choose from. The types are the routes' own answers, as JSON, so the page follows the server.
import type { InternalApi } from 'nitropack/types'

export type CutterView = InternalApi['/api/cutters/by-code/:code']['get']
/** What a logged cut's answer carries: the cutter's state and the log, for `withLoggedCut`. */
export type CutterAfterCut = InternalApi['/api/cutters/:id/cuts']['post']['cutter']
export type RemainingInMaterial = CutterView['remainingMinutes'][number]
export type RecentCut = CutterView['recentCuts'][number]
export type MachineChoice = InternalApi['/api/machines']['get'][number]
/** What a material picker needs: the list route's fields that the phone's offline copy keeps too. */
export type MaterialChoice = Pick<InternalApi['/api/materials']['get'][number], 'id' | 'name' | 'family' | 'wearFactor' | 'common'>

/** The cutter with this label code; nothing is asked of the server for a code that cannot exist. */
export function useCutter(code: MaybeRefOrGetter<string>, options: { valid: boolean }) {
  return useFetch(() => `/api/cutters/by-code/${encodeURIComponent(toValue(code))}`, {
    key: `cutter:${toValue(code)}`,
    immediate: options.valid,
  })
}

/** The shop's machines; loaded without blocking the page, and kept for the next visit. */
export function useMachines() {
  return useFetch('/api/machines', { key: 'machines', lazy: true, default: () => [] })
}

/** The shop's materials, common ones first. Loaded with the page so the cut form works offline. */
export function useMaterials() {
  return useFetch('/api/materials', { key: 'materials', lazy: true, default: () => [] })
}
