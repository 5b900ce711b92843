// Draft a resharpening batch from chosen cutters. Any cutter in the crib or a machine may go;
// those not due (or due to be retired) come back as warnings, and one already in another open
// batch is refused with a 409, decided under the cutters' row locks.
import { CreateBatchBody } from '#shared/schemas/regrind'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readValidatedBody(event, parseWith(CreateBatchBody))

  const { batchId, warnings } = await transaction(async (tx) => {
    await assertSupplier(tx, user.shopId, body.supplierId)
    const { cutters, warnings } = await claimCuttersForBatch(tx, user.shopId, body.cutterIds, null)
    const batch = await tx.insertInto('regrind_batches').values({
      shop_id: user.shopId, supplier_id: body.supplierId ?? null, note: body.note ?? '', created_by: user.id,
    }).returning('id').executeTakeFirstOrThrow()
    await addBatchItems(tx, user.shopId, batch.id, cutters)
    return { batchId: batch.id, warnings }
  })
  setResponseStatus(event, 201)
  return { batch: await requireRegrindBatchView(useDb(), user.shopId, batchId), warnings }
})
