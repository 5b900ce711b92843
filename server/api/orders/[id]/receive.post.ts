// Receive a delivery against an order (server/utils/crib/order-actions.ts): the cutters get label
// codes in one step, and the answer says which label sheet to print.
import { OrderIdParams, ReceiveOrderBody } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(OrderIdParams))
  const body = await readValidatedBody(event, parseWith(ReceiveOrderBody))
  return receiveOrder(useDb(), user, id, body)
})
