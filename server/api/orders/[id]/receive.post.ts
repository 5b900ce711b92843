// Receive a delivery against an order: the cutters are created with label codes in one step,
// and the answer says which label sheet to print.
import { OrderIdParams, ReceiveOrderBody } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(OrderIdParams))
  const body = await readValidatedBody(event, parseWith(ReceiveOrderBody))
  const created = await transaction(async (tx) => {
    const order = await lockOrder(tx, user.shopId, id)
    if (order.status !== 'sent' && order.status !== 'partly_received') {
      throw createError({ statusCode: 409, statusMessage: `${orderNumber(order.number)} is ${order.status.replace('_', ' ')}: only a sent order can be received.` })
    }
    const lines = await tx.selectFrom('purchase_order_lines as l')
      .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'l.type_id').onRef('t.shop_id', '=', 'l.shop_id'))
      .select(['l.id', 'l.type_id', 'l.quantity', 'l.received_quantity', 't.name', 't.cutting_diameter_mm'])
      .where('l.shop_id', '=', user.shopId).where('l.order_id', '=', id)
      .forUpdate('l').execute()
    const byId = new Map(lines.map((l) => [l.id, l]))
    const cutters = []
    for (const input of body.lines) {
      const line = byId.get(input.lineId)
      if (!line) throw createError({ statusCode: 400, statusMessage: `lines: line ${input.lineId} is not on ${orderNumber(order.number)}` })
      const open = line.quantity - line.received_quantity
      if (input.quantity > open) {
        throw createError({ statusCode: 400, statusMessage: `lines: only ${open} of ${line.name} are still to come on this order`, data: { fields: { [`line-${line.id}`]: `at most ${open}` } } })
      }
      if (input.quantity === 0) continue
      cutters.push(...Array.from({ length: input.quantity }, () => ({
        typeId: line.type_id, diameterMm: input.diameterMm ?? line.cutting_diameter_mm, orderLineId: line.id, note: `Received on ${orderNumber(order.number)}`,
      })))
      await tx.updateTable('purchase_order_lines').set({ received_quantity: line.received_quantity + input.quantity })
        .where('shop_id', '=', user.shopId).where('id', '=', line.id).execute()
      line.received_quantity += input.quantity
    }
    if (!cutters.length) throw createError({ statusCode: 400, statusMessage: 'lines: enter how many arrived on at least one line' })
    const complete = lines.every((l) => l.received_quantity >= l.quantity)
    await tx.updateTable('purchase_orders')
      .set({ status: complete ? 'received' : 'partly_received', ...(complete && { received_at: new Date() }) })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    return createCutters(tx, user.shopId, user.id, cutters)
  })
  return {
    order: await orderView(useDb(), user.shopId, id),
    cutters: created.map((c) => ({ id: c.id, code: c.code, typeId: c.type_id })),
    labelsUrl: `/labels?ids=${created.map((c) => c.id).join(',')}`,
  }
})
