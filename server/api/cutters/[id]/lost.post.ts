// Mark a cutter lost: it is not where the crib expects it, in the crib or in a machine.
import { NoteBody } from '#shared/schemas/inventory'
import { CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const { note } = await readValidatedBody(event, parseWith(NoteBody))
  await transaction(async (tx) => {
    const cutter = await lockCutter(tx, user.shopId, id)
    if (cutter.status !== 'in_crib' && cutter.status !== 'in_spindle') {
      throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}: only a cutter in the crib or a machine can be marked lost.` })
    }
    await tx.updateTable('cutters').set({ status: 'lost', machine_id: null, updated_at: new Date() })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    await recordEvent(tx, {
      shopId: user.shopId, cutterId: id, kind: 'lost', from: cutter.status, to: 'lost', machineId: cutter.machine_id, actorId: user.id, note,
    })
  })
  return { cutter: await requireCutterView(useDb(), user.shopId, { id }) }
})
