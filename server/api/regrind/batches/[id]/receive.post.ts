// Receive a batch back from the regrinder, every cutter with its measured diameter
// (server/utils/crib/regrind-actions.ts): each is reground or retired, in one transaction.
import { BatchIdParams, ReceiveBatchBody } from '#shared/schemas/regrind'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(BatchIdParams))
  const { items } = await readValidatedBody(event, parseWith(ReceiveBatchBody))
  return { batch: await receiveRegrindBatch(useDb(), user, id, items) }
})
