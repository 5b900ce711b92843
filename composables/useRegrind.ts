// The crib's resharpening data: the due list (with the suppliers a batch can go to) and the
// batches, each fetched under one key so every component on the page shares and refreshes it.
import type { InternalApi } from 'nitropack/types'

export type RegrindDue = InternalApi['/api/regrind/due']['get']
export type RegrindDueCutter = RegrindDue['cutters'][number]
export type RegrindBatchSummary = InternalApi['/api/regrind/batches']['get'][number]
export type RegrindBatch = InternalApi['/api/regrind/batches/:id']['get']
export type RegrindBatchItem = RegrindBatch['items'][number]

export function useRegrindDue() {
  return useFetch('/api/regrind/due', { key: 'regrind-due' })
}

export function useRegrindBatches() {
  return useFetch('/api/regrind/batches', { key: 'regrind-batches', default: () => [] })
}

export function useRegrindBatch(id: MaybeRefOrGetter<number>) {
  return useFetch(() => `/api/regrind/batches/${toValue(id)}`, { key: `regrind-batch-${toValue(id)}` })
}

/** After any change to a batch: the due list, the batch list and that batch. */
export async function refreshRegrind(batchId?: number) {
  await refreshNuxtData(['regrind-due', 'regrind-batches', ...(batchId ? [`regrind-batch-${batchId}`] : [])])
}

/** The shop's day of a moment in the reader's words (useDates), or a dash when there is none. */
export function useDayText() {
  const { date } = useDates()
  return (at: string | null | undefined) => (at ? date(at) : '—')
}

export const pctText = (fraction: number) => `${Math.round(fraction * 100)} %`
