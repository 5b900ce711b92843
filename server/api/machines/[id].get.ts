// One machine of the shop, retired or not.
import { IdParams } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  return requireMachine(useDb(), user.shopId, id)
})
