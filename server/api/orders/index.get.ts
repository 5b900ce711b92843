// The shop's purchase orders, open ones first.
import { sql } from 'kysely'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const rows = await useDb().selectFrom('purchase_orders as o')
    .leftJoin('suppliers as s', (j) => j.onRef('s.id', '=', 'o.supplier_id').onRef('s.shop_id', '=', 'o.shop_id'))
    .leftJoin('purchase_order_lines as l', (j) => j.onRef('l.order_id', '=', 'o.id').onRef('l.shop_id', '=', 'o.shop_id'))
    .select([
      'o.id', 'o.number', 'o.status', 'o.created_at', 'o.sent_at', 'o.received_at', 's.name as supplier_name',
      sql<number>`count(l.id)::int`.as('line_count'),
      sql<number>`coalesce(sum(l.quantity), 0)::bigint`.as('quantity'),
      sql<number>`coalesce(sum(l.received_quantity), 0)::bigint`.as('received_quantity'),
      // Money in bigint before it is multiplied: 10,000 x 2,500.00 overflows an integer.
      sql<number>`coalesce(sum(l.quantity::bigint * l.unit_cost_cents), 0)::bigint`.as('total_cents'),
    ])
    .where('o.shop_id', '=', user.shopId)
    .groupBy(['o.id', 's.name'])
    .orderBy(sql`case o.status when 'draft' then 0 when 'sent' then 1 when 'partly_received' then 1 else 2 end`)
    .orderBy('o.id', 'desc')
    .limit(500)
    .execute()
  return rows.map((o) => ({
    id: o.id, number: orderNumber(o.number), status: o.status, supplierName: o.supplier_name, createdAt: o.created_at, sentAt: o.sent_at,
    receivedAt: o.received_at, lineCount: o.line_count, quantity: o.quantity, receivedQuantity: o.received_quantity, totalCents: Number(o.total_cents),
  }))
})
