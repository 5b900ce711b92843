// Send a draft to the regrinder: every cutter leaves its machine or the crib and is out for
// resharpening, with an event each, all in one transaction under the batch's and the cutters'
// row locks. A cutter that changed since the draft (retired, lost, ...) stops the send with a
// 409 naming it. The list is e-mailed to the supplier afterwards when asked.
import { DUE_STATUSES } from '#shared/kerf/due'
import { BatchIdParams, SendBatchBody } from '#shared/schemas/regrind'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(BatchIdParams))
  const { emailSupplier } = await readValidatedBody(event, parseWith(SendBatchBody))

  await transaction(async (tx) => {
    const batch = await lockRegrindBatch(tx, user.shopId, id)
    requireBatchStatus(batch, 'draft', 'sent')
    const cutters = await tx.selectFrom('regrind_batch_items as i')
      .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'i.cutter_id').onRef('c.shop_id', '=', 'i.shop_id'))
      .select(['c.id', 'c.code', 'c.status', 'c.machine_id', 'c.diameter_mm'])
      .where('i.shop_id', '=', user.shopId).where('i.batch_id', '=', id)
      .orderBy('c.id')
      .forUpdate('c')
      .execute()
    if (!cutters.length) {
      throw createError({ statusCode: 409, statusMessage: `Batch ${batch.number} has no cutters. Add the cutters to send before sending it.` })
    }
    const changed = cutters.filter((c) => !(DUE_STATUSES as readonly string[]).includes(c.status))
    if (changed.length) {
      throw createError({
        statusCode: 409,
        statusMessage: `Some cutters changed since the batch was drafted: ${changed.map((c) => `${c.code} ${STATUS_SENTENCE[c.status]}`).join('; ')}. Take them out of the batch and send it again.`,
        data: { cutterIds: changed.map((c) => c.id) },
      })
    }

    const now = new Date()
    await tx.updateTable('cutters').set({ status: 'at_regrind', machine_id: null, updated_at: now })
      .where('shop_id', '=', user.shopId).where('id', 'in', cutters.map((c) => c.id))
      .execute()
    for (const c of cutters) {
      // The diameter it leaves at, in case it was measured again since the draft.
      await tx.updateTable('regrind_batch_items').set({ diameter_before_mm: c.diameter_mm })
        .where('shop_id', '=', user.shopId).where('batch_id', '=', id).where('cutter_id', '=', c.id)
        .execute()
      await recordEvent(tx, {
        shopId: user.shopId, cutterId: c.id, kind: 'sent_to_regrind', from: c.status, to: 'at_regrind',
        machineId: c.machine_id, actorId: user.id, note: `Batch ${batch.number}`,
      })
    }
    const { address } = await tx.selectFrom('shops').select('address').where('id', '=', user.shopId).executeTakeFirstOrThrow()
    await tx.updateTable('regrind_batches').set({ status: 'sent', sent_at: now, ship_to: address })
      .where('shop_id', '=', user.shopId).where('id', '=', id)
      .execute()
  })

  const batch = await requireRegrindBatchView(useDb(), user.shopId, id)
  return { batch, mail: emailSupplier ? await mailBatchToSupplier(user, batch) : null }
})
