// How cuts ended (melted, fuzzy, chip-out, broken) by material and by bit profile, with the breakage rate.
import { InsightsRangeQuery } from '#shared/schemas/insights'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'owner')
  const range = await insightsRange(user.shopId, await getValidatedQuery(event, parseWith(InsightsRangeQuery)))
  return { from: range.from, to: range.to, ...(await outcomes(useDb(), user.shopId, range)) }
})
