// The check before the job: per tool of the program, the cutter in its pocket on the chosen
// machine, life left in the material against the minutes needed for the repeats, and warnings.
import { CheckQuery, ProgramIdParams } from '#shared/schemas/programs'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(ProgramIdParams))
  const program = await requireProgram(useDb(), user.shopId, id)
  const q = await getValidatedQuery(event, parseWith(CheckQuery))
  return await checkBeforeJob(useDb(), user.shopId, program, q)
})
