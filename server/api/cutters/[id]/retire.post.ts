// Retire a cutter from the crib or a machine: worn out, or for another reason the note gives.
// Broken bits are retired by flagging them; resharpening runs retire undersize ones.
import { RetireBody } from '#shared/schemas/inventory'
import { CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const { reason, note } = await readValidatedBody(event, parseWith(RetireBody))
  await transaction(async (tx) => {
    const cutter = await lockCutter(tx, user.shopId, id)
    if (cutter.status !== 'in_crib' && cutter.status !== 'in_spindle') {
      throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}: only a cutter in the crib or a machine can be retired here.` })
    }
    await tx.updateTable('cutters').set({ status: 'retired', machine_id: null, retired_reason: reason, updated_at: new Date() })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    await recordEvent(tx, {
      shopId: user.shopId, cutterId: id, kind: 'retired', from: cutter.status, to: 'retired', machineId: cutter.machine_id, actorId: user.id,
      note: note || (reason === 'worn' ? 'Worn out' : 'Retired'),
    })
  })
  return { cutter: await requireCutterView(useDb(), user.shopId, { id }) }
})
