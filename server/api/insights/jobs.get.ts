// Tooling cost per job reference (and per sheet) from the logged runs of NC programs.
import { resolveRange } from '#shared/kerf/date-range'
import { InsightsRangeQuery } from '#shared/schemas/insights'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'owner')
  const query = await getValidatedQuery(event, parseWith(InsightsRangeQuery))
  const range = resolveRange(query)
  return { from: range.from, to: range.to, rows: await costByJob(useDb(), user.shopId, range) }
})
