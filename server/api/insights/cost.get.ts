// Tooling cost per cut-hour over a range of days, by material, machine, operator or cutter type.
import { CostQuery } from '#shared/schemas/insights'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'owner')
  const query = await getValidatedQuery(event, parseWith(CostQuery))
  const range = await insightsRange(user.shopId, query)
  const rows = await costByGroup(useDb(), user.shopId, range, query.by)
  return { from: range.from, to: range.to, by: query.by, rows }
})
