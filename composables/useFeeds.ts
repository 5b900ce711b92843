// Starting feeds and speeds for a pick of type, material and machine (and cutter), fetched under
// a key made of the pick, so the calculator page and the cutter page's card share answers. While
// the pick is incomplete there is nothing to ask, and the answer is null.
import type { InternalApi } from 'nitropack/types'
import { mmPerMinToInPerMin, mmToIn, type LengthUnit } from '#shared/kerf/units'

export type FeedsAnswer = InternalApi['/api/feeds']['get']
export type FeedsLearned = NonNullable<FeedsAnswer['learned']>

export interface FeedsPick {
  typeId?: number | null
  materialId?: number | null
  machineId?: number | null
  cutterId?: number | null
  depthMm?: number | null
}

export function useFeeds(pick: MaybeRefOrGetter<FeedsPick>) {
  const query = computed(() => {
    const p = toValue(pick)
    if (!p.typeId || !p.materialId || !p.machineId) return null
    return {
      typeId: p.typeId, materialId: p.materialId, machineId: p.machineId,
      ...(p.cutterId && { cutterId: p.cutterId }),
      ...(p.depthMm && p.depthMm > 0 && { depthMm: Number(p.depthMm.toFixed(3)) }),
    }
  })
  // On the server, $fetch alone would go without the visitor's session cookie.
  const request = useRequestFetch()
  const key = computed(() => (query.value ? `feeds:${new URLSearchParams(Object.entries(query.value).map(([k, v]) => [k, String(v)]))}` : 'feeds:none'))
  return useAsyncData(key, () => (query.value ? request<FeedsAnswer>('/api/feeds', { query: query.value }) : Promise.resolve(null)), { default: () => null })
}

/** Whole rpm with thousands separators, the way spindle displays show them. */
export const rpmText = (rpm: number) => rpm.toLocaleString('en-US')

/** A feed in the person's unit: "3200 mm/min" or "126.0 in/min"; the other unit for a second line. */
export function feedText(mmPerMin: number | null | undefined, unit: LengthUnit): string {
  if (mmPerMin === null || mmPerMin === undefined) return '—'
  return unit === 'in' ? `${mmPerMinToInPerMin(mmPerMin).toFixed(1)} in/min` : `${Math.round(mmPerMin).toLocaleString('en-US')} mm/min`
}

/** A feed split for a big figure with a small unit beside it. */
export function feedParts(mmPerMin: number | null | undefined, unit: LengthUnit): { value: string, unit: string } {
  const [value = '—', ...rest] = feedText(mmPerMin, unit).split(' ')
  return { value, unit: rest.join(' ') }
}

/** A chip load per tooth: "0.178 mm" or "0.0070 in" (the usual inch precision for chip loads). */
export function chipText(mm: number | null | undefined, unit: LengthUnit): string {
  if (mm === null || mm === undefined) return '—'
  return unit === 'in' ? `${mmToIn(mm).toFixed(4)} in` : `${mm.toFixed(3)} mm`
}

/** Warnings about heat and melting are ember; the rest are amber. */
export const MELT_WARNINGS = ['downcut_in_plastic', 'chip_load_low', 'dull_in_hard_plastic']

/** The server's sentence from a failed answer (useAsyncData keeps it in the error's data). */
export function feedsProblem(err: { data?: unknown, message: string, cause?: unknown } | null | undefined): string | null {
  if (!err) return null
  // The server's sentence when it gave one; else the fetch failure in words (offline, not a URL).
  return (err.data as { message?: string } | undefined)?.message ?? apiProblem(err.cause ?? err).message
}
