// One purchase order with its lines.
import { OrderIdParams } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(OrderIdParams))
  return orderView(useDb(), user.shopId, id)
})
