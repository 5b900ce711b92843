// Tooling spend by month: new cutters received against regrinds paid for.
import { InsightsRangeQuery } from '#shared/schemas/insights'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'owner')
  const range = await insightsRange(user.shopId, await getValidatedQuery(event, parseWith(InsightsRangeQuery)))
  const months = await spendByMonth(useDb(), user.shopId, range)
  return { from: range.from, to: range.to, months }
})
