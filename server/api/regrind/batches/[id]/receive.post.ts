// Receive cutters of a batch back from the regrinder, all or some: each with its measured
// diameter (a new sharp life, or retired when it came back below the type's minimum usable
// diameter or past its maximum regrinds), or written off with the reason the regrinder scrapped
// it. The batch stays at the regrinder until every cutter is back or written off.
import { BatchIdParams, ReceiveBatchBody } from '#shared/schemas/regrind'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(BatchIdParams))
  const { items } = await readValidatedBody(event, parseWith(ReceiveBatchBody))
  const receipt = await transaction((tx) => receiveRegrindItems(tx, user, id, items))
  return { batch: await requireRegrindBatchView(useDb(), user.shopId, id), receipt }
})
