// Cancel an order that has not been received.
import { OrderIdParams } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(OrderIdParams))
  await transaction(async (tx) => {
    const order = await lockOrder(tx, user.shopId, id)
    if (order.status !== 'draft' && order.status !== 'sent') {
      throw createError({ statusCode: 409, statusMessage: `${orderNumber(order.number)} is ${order.status.replace('_', ' ')} and cannot be cancelled.` })
    }
    await tx.updateTable('purchase_orders').set({ status: 'cancelled' }).where('shop_id', '=', user.shopId).where('id', '=', id).execute()
  })
  return orderView(useDb(), user.shopId, id)
})
