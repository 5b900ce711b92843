// Start a purchase order by hand: a draft for one supplier with its lines.
import { NewOrderBody } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readValidatedBody(event, parseWith(NewOrderBody))
  const id = await transaction(async (tx) => {
    const supplier = await tx.selectFrom('suppliers').select('id')
      .where('shop_id', '=', user.shopId).where('id', '=', body.supplierId).executeTakeFirst()
    if (!supplier) throw createError({ statusCode: 400, statusMessage: 'supplierId: no such supplier in your shop', data: { fields: { supplierId: 'no such supplier in your shop' } } })
    const order = await tx.insertInto('purchase_orders')
      .values({ shop_id: user.shopId, supplier_id: body.supplierId, note: body.note ?? '', created_by: user.id })
      .returning('id').executeTakeFirstOrThrow()
    await replaceOrderLines(tx, user.shopId, order.id, body.lines)
    return order.id
  })
  setResponseStatus(event, 201)
  return orderView(useDb(), user.shopId, id)
})
