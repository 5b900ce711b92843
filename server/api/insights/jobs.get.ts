// Tooling cost per job reference (and per sheet) from the logged runs of NC programs.
import { InsightsRangeQuery } from '#shared/schemas/insights'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'owner')
  const query = await getValidatedQuery(event, parseWith(InsightsRangeQuery))
  const range = await insightsRange(user.shopId, query)
  return { from: range.from, to: range.to, rows: await costByJob(useDb(), user.shopId, range) }
})
