// One cutter type of the shop, for its edit page.
import { IdParams } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  return requireCutterType(useDb(), user.shopId, id)
})
