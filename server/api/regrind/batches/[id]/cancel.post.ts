// Cancel a draft: its cutters are free again. Cancelling twice is harmless; a batch already
// sent is received back instead.
import { BatchIdParams } from '#shared/schemas/regrind'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(BatchIdParams))
  await transaction(async (tx) => {
    const batch = await lockRegrindBatch(tx, user.shopId, id)
    if (batch.status === 'cancelled') return
    requireBatchStatus(batch, 'draft', 'cancelled')
    await tx.updateTable('regrind_batches').set({ status: 'cancelled' })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
  })
  return { batch: await requireRegrindBatchView(useDb(), user.shopId, id) }
})
