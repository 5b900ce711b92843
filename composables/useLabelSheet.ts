// The label sheet's cutters, chosen by the page's query string (?ids=, ?typeId= or ?orderId=).
import type { LocationQuery } from 'vue-router'

export type LabelSelection = Partial<Record<'ids' | 'typeId' | 'orderId', string>>

/** The selectors present in a route's query, or null when there are none (nothing to print). */
export function labelSelectionFrom(query: LocationQuery): LabelSelection | null {
  const selection: LabelSelection = {}
  for (const key of ['ids', 'typeId', 'orderId'] as const) {
    const value = query[key]
    if (typeof value === 'string' && value.trim()) selection[key] = value.trim()
  }
  return Object.keys(selection).length ? selection : null
}

export function useLabelSheet(selection: Ref<LabelSelection | null>) {
  // Forwards the session cookie when the page renders on the server.
  const request = useRequestFetch()
  return useAsyncData(
    () => `labels:${JSON.stringify(selection.value)}`,
    () => (selection.value ? request('/api/labels', { query: selection.value }) : Promise.resolve(null)),
  )
}
