// Log a cut (server/utils/spindle/cuts.ts): 201 with the log, the cutter's new totals and what
// changed in the cutter as the pages show it; 200 with the first log when its idempotency key was sent before.
import { CutLogBody, CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const body = await readValidatedBody(event, parseWith(CutLogBody))
  const answer = await logCut(useDb(), user, id, body)
  setResponseStatus(event, answer.replay ? 200 : 201)
  return answer
})
