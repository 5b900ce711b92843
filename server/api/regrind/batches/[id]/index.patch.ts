// Change a draft: add or remove cutters, choose the supplier, edit the note. Once sent, a
// batch is fixed.
import { BatchIdParams, EditBatchBody } from '#shared/schemas/regrind'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(BatchIdParams))
  const body = await readValidatedBody(event, parseWith(EditBatchBody))

  const warnings = await transaction(async (tx) => {
    const batch = await lockRegrindBatch(tx, user.shopId, id)
    requireBatchStatus(batch, 'draft', 'changed')
    await assertSupplier(tx, user.shopId, body.supplierId)
    const remove = new Set(body.removeCutterIds ?? [])
    const add = (body.addCutterIds ?? []).filter((c) => !remove.has(c))
    if (remove.size) {
      await tx.deleteFrom('regrind_batch_items')
        .where('shop_id', '=', user.shopId).where('batch_id', '=', id).where('cutter_id', 'in', [...remove])
        .execute()
    }
    const { cutters, warnings } = await claimCuttersForBatch(tx, user.shopId, add, id)
    await addBatchItems(tx, user.shopId, id, cutters)
    if (body.supplierId !== undefined || body.note !== undefined) {
      await tx.updateTable('regrind_batches')
        .set({
          ...(body.supplierId !== undefined && { supplier_id: body.supplierId }),
          ...(body.note !== undefined && { note: body.note }),
        })
        .where('shop_id', '=', user.shopId).where('id', '=', id)
        .execute()
    }
    return warnings
  })
  return { batch: await requireRegrindBatchView(useDb(), user.shopId, id), warnings }
})
