// One cutter by id, in the same shape as the label-code lookup.
import { CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  return requireCutterView(useDb(), user.shopId, { id })
})
