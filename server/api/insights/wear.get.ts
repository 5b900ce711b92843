// Each material's learned wear factor beside its starting one, with its 90 % interval, the lives
// behind it and what the data cannot tell; each cutter type's lives against its rating; the
// scatter of life. Crib managers read it too: they are the ones who adopt the figures.
import { InsightsRangeQuery } from '#shared/schemas/insights'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const range = await insightsRange(user.shopId, await getValidatedQuery(event, parseWith(InsightsRangeQuery)))
  const { materials, types, scatter, referenceMaterialId } = await learnedWear(useDb(), user.shopId, range)
  return { from: range.from, to: range.to, materials, scatter, referenceMaterialId, types }
})
