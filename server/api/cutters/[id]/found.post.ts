// A lost cutter turned up: it goes back to the crib.
import { NoteBody } from '#shared/schemas/inventory'
import { CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const { note } = await readValidatedBody(event, parseWith(NoteBody))
  await transaction(async (tx) => {
    const cutter = await lockCutter(tx, user.shopId, id)
    if (cutter.status !== 'lost') {
      throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}, not marked lost, so it cannot be found.` })
    }
    await tx.updateTable('cutters').set({ status: 'in_crib', updated_at: new Date() })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    await recordEvent(tx, { shopId: user.shopId, cutterId: id, kind: 'found', from: 'lost', to: 'in_crib', actorId: user.id, note })
  })
  return { cutter: await requireCutterView(useDb(), user.shopId, { id }) }
})
