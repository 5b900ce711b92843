// Take a cutter out of its machine and back to the crib. Returning one already in the crib is harmless.
import { CutterIdParams, ReturnBody } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const body = await readValidatedBody(event, parseWith(ReturnBody))
  return {
    cutter: await changeCutter(user, id, (cutter) => {
      if (cutter.status === 'in_crib') return undefined
      if (cutter.status !== 'in_spindle') {
        throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}, not in a machine.` })
      }
      return { set: { status: 'in_crib', machine_id: null }, event: { kind: 'returned', to: 'in_crib', machineId: cutter.machine_id } }
    }, { idempotencyKey: body?.idempotencyKey }),
  }
})
