// The owner's insights over one date range: wear by material, cost per cut-hour, spend by month
// and outcomes, each fetched under its own key and refetched when the range changes.
import type { InternalApi } from 'nitropack/types'
import type { CostGroup } from '#shared/schemas/insights'

export type WearInsight = InternalApi['/api/insights/wear']['get']['materials'][number]
export type WearTypeInsight = InternalApi['/api/insights/wear']['get']['types'][number]
export type CostInsight = InternalApi['/api/insights/cost']['get']['rows'][number]
export type SpendInsight = InternalApi['/api/insights/spend']['get']['months'][number]
export type OutcomeInsight = InternalApi['/api/insights/outcomes']['get']['byMaterial'][number]
export type CleanupInsight = InternalApi['/api/insights/cleanup']['get']['rows'][number]

export function useInsights(range: Ref<{ from: string, to: string }>, by: Ref<CostGroup>) {
  const query = computed(() => ({ from: range.value.from, to: range.value.to }))
  return {
    wear: useFetch('/api/insights/wear', {
      key: 'insights-wear', query, default: () => ({ from: '', to: '', materials: [], types: [], scatter: null, referenceMaterialId: null }),
    }),
    // Cost per cut-hour by material for the wear ranking, whatever the cost table is grouped by.
    materialCost: useFetch('/api/insights/cost', {
      key: 'insights-cost-material', query: computed(() => ({ ...query.value, by: 'material' as const })),
      transform: (res) => Object.fromEntries(res.rows.filter((r) => typeof r.key === 'number').map((r) => [r.key, r.costPerCutHourCents])) as Record<number, number | null>,
      default: () => ({}) as Record<number, number | null>,
    }),
    cost: useFetch('/api/insights/cost', {
      key: 'insights-cost', query: computed(() => ({ ...query.value, by: by.value })), default: () => ({ from: '', to: '', by: by.value, rows: [] }),
    }),
    spend: useFetch('/api/insights/spend', { key: 'insights-spend', query, default: () => ({ from: '', to: '', months: [] }) }),
    outcomes: useFetch('/api/insights/outcomes', {
      key: 'insights-outcomes', query, default: () => ({ from: '', to: '', logs: 0, broken: 0, breakageRate: null, byMaterial: [], byProfile: [] }),
    }),
    cleanup: useFetch('/api/insights/cleanup', {
      key: 'insights-cleanup', query, default: () => ({ from: '', to: '', labourRateCentsPerHour: null, rows: [] }),
    }),
  }
}

export const percent = (fraction: number | null | undefined) => (fraction === null || fraction === undefined ? '—' : `${(fraction * 100).toFixed(1)} %`)
