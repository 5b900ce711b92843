// Send a draft to the regrinder (server/utils/crib/regrind-actions.ts): every cutter is out for
// resharpening, and the list is e-mailed to the supplier when asked.
import { BatchIdParams, SendBatchBody } from '#shared/schemas/regrind'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(BatchIdParams))
  const { emailSupplier } = await readValidatedBody(event, parseWith(SendBatchBody))
  return sendRegrindBatch(useDb(), user, id, emailSupplier)
})
