// Clear a dull flag set by mistake, so the cutter is no longer due for resharpening on its account.
// A broken flag stays: the cutter was retired with it.
import { NoteBody } from '#shared/schemas/inventory'
import { CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const { note } = await readValidatedBody(event, parseWith(NoteBody))
  return {
    cutter: await changeCutter(user, id, (cutter) => {
      if (cutter.flagged !== 'dull') {
        throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} is not flagged dull, so there is no flag to clear.` })
      }
      if (cutter.status === 'at_regrind' || cutter.status === 'retired') {
        throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}; its dull flag stays with that record.` })
      }
      return {
        set: { flagged: null, flagged_at: null },
        event: { kind: 'edited', to: cutter.status, note: note ? `Dull flag cleared: ${note}` : 'Dull flag cleared' },
      }
    }),
  }
})
