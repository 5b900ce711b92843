// Receive cutters of a batch back from the regrinder, all or some, each with its measured
// diameter or the reason the regrinder scrapped it (server/utils/crib/regrind-actions.ts). The
// batch stays at the regrinder until every cutter is back or written off.
import { BatchIdParams, ReceiveBatchBody } from '#shared/schemas/regrind'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(BatchIdParams))
  const { items } = await readValidatedBody(event, parseWith(ReceiveBatchBody))
  return receiveRegrindBatch(useDb(), user, id, items)
})
