// Correct a cut log's minutes, material, outcome or note, with a reason: its operator within
// 24 hours of logging it, a crib manager or owner at any time. Answers the cutter as the pages show it.
import { CutLogCorrectionBody, CutLogIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutLogIdParams))
  const { reason, ...change } = await readValidatedBody(event, parseWith(CutLogCorrectionBody))
  return { cutter: await changeCutLog(user, id, change, reason) }
})
