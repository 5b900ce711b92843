// Everything that happened to one cutter, newest first: state changes with who made them, and
// every cut logged with it. Paged, a hundred entries at a time by default.
import { HistoryQuery } from '#shared/schemas/inventory'
import { CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const { page, pageSize } = await getValidatedQuery(event, parseWith(HistoryQuery))
  return cutterHistory(useDb(), user.shopId, id, page, pageSize)
})
