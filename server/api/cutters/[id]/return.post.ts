// Take a cutter out of its machine and back to the crib. Returning one already in the crib is harmless.
import { CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  await transaction(async (tx) => {
    const cutter = await lockCutter(tx, user.shopId, id)
    if (cutter.status === 'in_crib') return
    if (cutter.status !== 'in_spindle') {
      throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}, not in a machine.` })
    }
    await tx.updateTable('cutters').set({ status: 'in_crib', machine_id: null, updated_at: new Date() })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    await recordEvent(tx, {
      shopId: user.shopId, cutterId: id, kind: 'returned', from: 'in_spindle', to: 'in_crib', machineId: cutter.machine_id, actorId: user.id,
    })
  })
  return { cutter: await requireCutterView(useDb(), user.shopId, { id }) }
})
