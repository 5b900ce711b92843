// Purchase orders as the crib sees them, and the e-mail a supplier gets.
import { showMoney } from '#shared/kerf/money'
import type { Queryable } from '../../db/connect'
import type { OutgoingMail } from '../platform/mail'

export async function orderView(db: Queryable, shopId: number, id: number) {
  const order = await db.selectFrom('purchase_orders as o')
    .leftJoin('suppliers as s', (j) => j.onRef('s.id', '=', 'o.supplier_id').onRef('s.shop_id', '=', 'o.shop_id'))
    .leftJoin('users as u', 'u.id', 'o.created_by')
    .select(['o.id', 'o.status', 'o.note', 'o.created_at', 'o.sent_at', 'o.received_at', 'o.supplier_id',
      's.name as supplier_name', 's.email as supplier_email', 's.lead_time_days', 'u.name as created_by_name'])
    .where('o.shop_id', '=', shopId).where('o.id', '=', id)
    .executeTakeFirst()
  if (!order) notFound('purchase order')
  const lines = await db.selectFrom('purchase_order_lines as l')
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'l.type_id').onRef('t.shop_id', '=', 'l.shop_id'))
    .select(['l.id', 'l.type_id', 't.name as type_name', 't.supplier_part_number', 't.pack_size', 't.cutting_diameter_mm',
      'l.quantity', 'l.received_quantity', 'l.unit_cost_cents'])
    .where('l.shop_id', '=', shopId).where('l.order_id', '=', id)
    .orderBy('t.name').execute()
  return {
    id: order.id,
    number: orderNumber(order.id),
    status: order.status,
    note: order.note,
    createdAt: order.created_at,
    createdBy: order.created_by_name,
    sentAt: order.sent_at,
    receivedAt: order.received_at,
    supplier: order.supplier_id === null ? null : { id: order.supplier_id, name: order.supplier_name!, email: order.supplier_email, leadTimeDays: order.lead_time_days },
    lines: lines.map((l) => ({
      id: l.id, typeId: l.type_id, typeName: l.type_name, supplierPartNumber: l.supplier_part_number, packSize: l.pack_size,
      nominalDiameterMm: l.cutting_diameter_mm, quantity: l.quantity, receivedQuantity: l.received_quantity,
      unitCostCents: l.unit_cost_cents, totalCents: l.quantity * l.unit_cost_cents,
    })),
    totalCents: lines.reduce((sum, l) => sum + l.quantity * l.unit_cost_cents, 0),
  }
}
export type OrderView = Awaited<ReturnType<typeof orderView>>

export const orderNumber = (id: number) => `PO-${String(id).padStart(5, '0')}`

/** The shop as a purchase order names it: its name and, once given, its postal address. */
export async function orderLetterhead(db: Queryable, shopId: number) {
  const shop = await db.selectFrom('shops').select('name').where('id', '=', shopId).executeTakeFirstOrThrow()
  return { name: shop.name, addressLines: [] as string[] }
}


export function orderMail(order: OrderView, shop: { name: string, addressLines: readonly string[] }, senderName: string, pdf?: Buffer): OutgoingMail {
  const shopName = shop.name
  const rows = order.lines.map((l) => ({
    part: l.supplierPartNumber || '(no part number)', name: l.typeName, qty: l.quantity, unit: showMoney(l.unitCostCents), total: showMoney(l.totalCents),
  }))
  const text = [
    `Hello ${order.supplier?.name ?? ''},`,
    '',
    `${shopName} orders the following (${order.number}):`,
    '',
    ...rows.map((r) => `- ${r.qty} x ${r.part}  ${r.name}  at ${r.unit} = ${r.total}`),
    '',
    `Order total: ${showMoney(order.totalCents)}`,
    ...(order.note ? ['', `Note: ${order.note}`] : []),
    '',
    `Deliver to: ${[shopName, ...shop.addressLines].join(', ')}`,
    '',
    'Please confirm the delivery date by replying to this e-mail. The purchase order is attached as a PDF.',
    '',
    `${senderName}, ${shopName}`,
  ].join('\n')
  const cell = 'padding:6px 10px;border-bottom:1px solid #cfc8b8;text-align:left'
  const html = `<!doctype html><html><body style="font-family:Arial,sans-serif;color:#15191c">
<p>Hello ${escapeHtml(order.supplier?.name ?? '')},</p>
<p>${escapeHtml(shopName)} orders the following (<strong>${order.number}</strong>):</p>
<table style="border-collapse:collapse"><tr><th style="${cell}">Qty</th><th style="${cell}">Part number</th><th style="${cell}">Description</th><th style="${cell}">Unit</th><th style="${cell}">Total</th></tr>
${rows.map((r) => `<tr><td style="${cell}">${r.qty}</td><td style="${cell}">${escapeHtml(r.part)}</td><td style="${cell}">${escapeHtml(r.name)}</td><td style="${cell}">${r.unit}</td><td style="${cell}">${r.total}</td></tr>`).join('\n')}
</table>
<p><strong>Order total: ${showMoney(order.totalCents)}</strong></p>
${order.note ? `<p>Note: ${escapeHtml(order.note)}</p>` : ''}
<p>Deliver to: ${escapeHtml([shopName, ...shop.addressLines].join(', '))}</p>
<p>Please confirm the delivery date by replying to this e-mail. The purchase order is attached as a PDF.</p>
<p>${escapeHtml(senderName)}, ${escapeHtml(shopName)}</p></body></html>`
  return {
    to: order.supplier?.email ?? '', subject: `Purchase order ${order.number} from ${shopName}`, text, html,
    ...(pdf && { attachments: [{ filename: orderPdfName(order), content: pdf, contentType: 'application/pdf' }] }),
  }
}
