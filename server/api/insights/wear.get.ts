// Each material's learned wear factor beside its starting one, from the lives that ended in
// the range. Crib managers read it too: they are the ones who adopt the figures.
import { resolveRange } from '#shared/kerf/date-range'
import { InsightsRangeQuery } from '#shared/schemas/insights'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const range = resolveRange(await getValidatedQuery(event, parseWith(InsightsRangeQuery)))
  const materials = await learnedWear(useDb(), user.shopId, range)
  return { from: range.from, to: range.to, materials }
})
