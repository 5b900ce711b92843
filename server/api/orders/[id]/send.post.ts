// Send a draft order to its supplier by e-mail (server/utils/crib/order-actions.ts); marked sent
// only when the mail server took it.
import { OrderIdParams } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(OrderIdParams))
  return sendOrder(useDb(), user, id)
})
