// Log a run of a program: each tool's minutes against the cutter in its pocket, as cut logs, once
// per idempotency key (201 the first time, 200 with the same logs for a retry).
import { ProgramIdParams, RunBody } from '#shared/schemas/programs'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(ProgramIdParams))
  const body = await readValidatedBody(event, parseWith(RunBody))
  const result = await logRun(user, id, body)
  setResponseStatus(event, result.replay ? 200 : 201)
  return result
})
