// Send a draft order to its supplier by e-mail. The e-mail goes out inside the transaction, so
// an order is marked sent only when the mail server took it.
import { OrderIdParams } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(OrderIdParams))
  await transaction(async (tx) => {
    const order = await lockOrder(tx, user.shopId, id)
    if (order.status !== 'draft') throw createError({ statusCode: 409, statusMessage: `${orderNumber(order.number)} was already sent.` })
    const view = await orderView(tx, user.shopId, id)
    if (!view.supplier?.email) {
      throw createError({ statusCode: 400, statusMessage: 'The supplier has no e-mail address. Add one in Suppliers, then send again.' })
    }
    const shop = await shopLetterhead(tx, user.shopId)
    // The address the order went out with stays on it, whatever the shop's address becomes.
    await tx.updateTable('purchase_orders').set({ status: 'sent', sent_at: new Date(), ship_to: shop.address })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    try {
      await sendMail(orderMail(view, shop, user.name))
    } catch (err) {
      throw createError({ statusCode: 502, statusMessage: `The mail server did not take the order: ${err instanceof Error ? err.message : err}. Nothing was sent; try again.` })
    }
  })
  return orderView(useDb(), user.shopId, id)
})
