// One supplier of the shop.
import { IdParams } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  return requireSupplier(useDb(), user.shopId, id)
})
