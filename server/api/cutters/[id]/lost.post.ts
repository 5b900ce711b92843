// Mark a cutter lost: it is not where the crib expects it, in the crib or in a machine.
import { NoteBody } from '#shared/schemas/inventory'
import { CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const { note } = await readValidatedBody(event, parseWith(NoteBody))
  return {
    cutter: await changeCutter(user, id, (cutter) => {
      if (cutter.status !== 'in_crib' && cutter.status !== 'in_spindle') {
        throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}: only a cutter in the crib or a machine can be marked lost.` })
      }
      return { set: { status: 'lost', machine_id: null }, event: { kind: 'lost', to: 'lost', machineId: cutter.machine_id, note } }
    }),
  }
})
