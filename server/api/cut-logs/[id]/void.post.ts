// Void a cut log, with a reason: it stays in the history and counts nowhere. Same rules as a
// correction; voiding twice is harmless. Answers the cutter as the pages show it.
import { CutLogIdParams, CutLogVoidBody } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutLogIdParams))
  const { reason } = await readValidatedBody(event, parseWith(CutLogVoidBody))
  return { cutter: await changeCutLog(user, id, 'void', reason) }
})
