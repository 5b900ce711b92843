// Load a cutter into a machine, into a pocket of one with a tool changer (server/utils/spindle/load.ts);
// answers the cutter as the pages show it.
import { CutterIdParams, LoadBody } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const body = await readValidatedBody(event, parseWith(LoadBody))
  return { cutter: await loadCutter(useDb(), user, id, body) }
})
