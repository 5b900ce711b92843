// Writing an order's lines: each type must be the shop's, its unit cost defaults to the
// catalogue's, and a type appears once per order.
import type { Tx } from '../../db/connect'

export async function replaceOrderLines(tx: Tx, shopId: number, orderId: number,
  lines: ReadonlyArray<{ typeId: number, quantity: number, unitCostCents?: number }>): Promise<void> {
  const ids = [...new Set(lines.map((l) => l.typeId))]
  if (ids.length !== lines.length) {
    badField('lines', 'each cutter type may appear only once')
  }
  const types = await tx.selectFrom('cutter_types').select(['id', 'unit_cost_cents'])
    .where('shop_id', '=', shopId).where('id', 'in', ids).execute()
  const cost = new Map(types.map((t) => [t.id, t.unit_cost_cents]))
  const unknown = ids.filter((id) => !cost.has(id))
  if (unknown.length) {
    fieldError({ lines: 'unknown cutter type' }, { message: `lines: no cutter type ${unknown.join(', ')} in your shop` })
  }
  await tx.deleteFrom('purchase_order_lines').where('shop_id', '=', shopId).where('order_id', '=', orderId).execute()
  await tx.insertInto('purchase_order_lines').values(lines.map((l) => ({
    shop_id: shopId, order_id: orderId, type_id: l.typeId, quantity: l.quantity, unit_cost_cents: l.unitCostCents ?? cost.get(l.typeId)!,
  }))).execute()
}

/** The order's row, locked; 404 when it is not the shop's. */
export async function lockOrder(tx: Tx, shopId: number, id: number) {
  const order = await tx.selectFrom('purchase_orders').select(['id', 'number', 'status', 'supplier_id'])
    .where('shop_id', '=', shopId).where('id', '=', id).forUpdate().executeTakeFirst()
  if (!order) notFound('purchase order')
  return order
}
