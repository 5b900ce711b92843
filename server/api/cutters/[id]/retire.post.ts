// Retire a cutter from the crib or a machine: worn out, or for another reason the note gives.
// Broken bits are retired by flagging them; resharpening runs retire undersize ones.
import { RetireBody } from '#shared/schemas/inventory'
import { CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const { reason, note } = await readValidatedBody(event, parseWith(RetireBody))
  return {
    cutter: await changeCutter(user, id, (cutter) => {
      if (cutter.status !== 'in_crib' && cutter.status !== 'in_spindle') {
        throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}: only a cutter in the crib or a machine can be retired here.` })
      }
      return {
        set: { status: 'retired', machine_id: null, retired_reason: reason },
        event: { kind: 'retired', to: 'retired', machineId: cutter.machine_id, note: note || (reason === 'worn' ? 'Worn out' : 'Retired') },
      }
    }),
  }
})
