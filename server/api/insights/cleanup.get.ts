// Outcomes and cleanup minutes a part by cutter type × material, priced at the shop's labour rate.
import { InsightsRangeQuery } from '#shared/schemas/insights'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'owner')
  const range = await insightsRange(user.shopId, await getValidatedQuery(event, parseWith(InsightsRangeQuery)))
  return { from: range.from, to: range.to, ...(await cleanupByTypeAndMaterial(useDb(), user.shopId, range)) }
})
