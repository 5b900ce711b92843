// Load a cutter into a machine (server/utils/spindle/load.ts): a one-bit machine's bit can be
// returned in the same step (`returnCutterId`). Answers the cutter as the pages show it.
import { CutterIdParams, LoadBody } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const { machineId, returnCutterId } = await readValidatedBody(event, parseWith(LoadBody))
  return { cutter: await loadCutter(useDb(), user, id, machineId, returnCutterId) }
})
