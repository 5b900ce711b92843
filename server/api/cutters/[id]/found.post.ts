// A lost cutter turned up: it goes back to the crib.
import { NoteBody } from '#shared/schemas/inventory'
import { CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const { note } = await readValidatedBody(event, parseWith(NoteBody))
  return {
    cutter: await changeCutter(user, id, (cutter) => {
      if (cutter.status !== 'lost') {
        throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}, not marked lost, so it cannot be found.` })
      }
      return { set: { status: 'in_crib' }, event: { kind: 'found', to: 'in_crib', note } }
    }),
  }
})
