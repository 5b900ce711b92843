// Edit a draft order's lines or note. Sent orders are fixed: cancel and start again.
import { OrderIdParams, OrderUpdateBody } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(OrderIdParams))
  const body = await readValidatedBody(event, parseWith(OrderUpdateBody))
  await transaction(async (tx) => {
    const order = await lockOrder(tx, user.shopId, id)
    if (order.status !== 'draft') {
      throw createError({ statusCode: 409, statusMessage: `${orderNumber(order.number)} has been ${order.status.replace('_', ' ')}; only drafts can be edited.` })
    }
    if (body.note !== undefined) await tx.updateTable('purchase_orders').set({ note: body.note }).where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    if (body.lines) await replaceOrderLines(tx, user.shopId, id, body.lines)
  })
  return orderView(useDb(), user.shopId, id)
})
