// Start a purchase order by hand: a draft for one supplier with its lines.
import { NewOrderBody } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readValidatedBody(event, parseWith(NewOrderBody))
  const id = await transaction(async (tx) => {
    await supplierForField(tx, user.shopId, body.supplierId)
    const order = await tx.insertInto('purchase_orders')
      .values({ shop_id: user.shopId, supplier_id: body.supplierId, note: body.note ?? '', created_by: user.id })
      .returning('id').executeTakeFirstOrThrow()
    await replaceOrderLines(tx, user.shopId, order.id, body.lines)
    return order.id
  })
  setResponseStatus(event, 201)
  return orderView(useDb(), user.shopId, id)
})
