// Purchase orders as the crib sees them, and the e-mail a supplier gets.
import { showMoney, type Currency } from '#shared/kerf/money'
import type { Queryable } from '../../db/connect'
import type { OutgoingMail } from '../platform/mail'

export async function orderView(db: Queryable, shopId: number, id: number) {
  const order = await db.selectFrom('purchase_orders as o')
    .leftJoin('suppliers as s', (j) => j.onRef('s.id', '=', 'o.supplier_id').onRef('s.shop_id', '=', 'o.shop_id'))
    .leftJoin('users as u', 'u.id', 'o.created_by')
    .select(['o.id', 'o.number', 'o.ship_to', 'o.status', 'o.note', 'o.created_at', 'o.sent_at', 'o.received_at', 'o.supplier_id',
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
    number: orderNumber(order.number),
    /** The shop's address as printed when the order was sent (null for a draft: the shop's current one then applies). */
    shipTo: order.ship_to,
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

/** The order's number within its shop: the shop's first order is PO-00001. */
export const orderNumber = (n: number) => `PO-${String(n).padStart(5, '0')}`

/** The shop as a purchase order names it: its name and, once given, its postal address. */
/** The shop's letterhead with its address as lines, for the purchase order's PDF and e-mail. */
export async function orderLetterhead(db: Queryable, shopId: number) {
  const shop = await shopLetterhead(db, shopId)
  return { ...shop, addressLines: shop.address.split('\n').filter(Boolean) }
}

/** What a supplier's e-mail says about the shop sending it. */
export interface ShopLetterhead { name: string, address: string, phone: string | null, replyEmail: string | null, currency: Currency, timeZone: string }

export async function shopLetterhead(db: Queryable, shopId: number): Promise<ShopLetterhead> {
  const s = await db.selectFrom('shops').select(['name', 'address', 'phone', 'reply_email', 'currency', 'time_zone'])
    .where('id', '=', shopId).executeTakeFirstOrThrow()
  return { name: s.name, address: s.address, phone: s.phone, replyEmail: s.reply_email, currency: s.currency, timeZone: s.time_zone }
}

/** The shop's address block: its name, the address lines and the phone. */
export function letterheadLines(shop: ShopLetterhead): string[] {
  return [shop.name, ...shop.address.split('\n').filter(Boolean), ...(shop.phone ? [`Phone ${shop.phone}`] : [])]
}

export function orderMail(order: OrderView, shop: ShopLetterhead, senderName: string, pdf?: Buffer): OutgoingMail {
  const money = (cents: number) => showMoney(cents, shop.currency)
  const shopName = shop.name
  const deliverTo = letterheadLines(shop)
  const rows = order.lines.map((l) => ({
    part: l.supplierPartNumber || '(no part number)', name: l.typeName, qty: l.quantity, unit: money(l.unitCostCents), total: money(l.totalCents),
  }))
  const text = [
    `Hello ${order.supplier?.name ?? ''},`,
    '',
    `${shopName} orders the following (${order.number}):`,
    '',
    ...rows.map((r) => `- ${r.qty} x ${r.part}  ${r.name}  at ${r.unit} = ${r.total}`),
    '',
    `Order total: ${money(order.totalCents)}`,
    ...(order.note ? ['', `Note: ${order.note}`] : []),
    '',
    'Deliver to:',
    ...deliverTo,
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
<p><strong>Order total: ${money(order.totalCents)}</strong></p>
${order.note ? `<p>Note: ${escapeHtml(order.note)}</p>` : ''}
<p><strong>Deliver to:</strong><br>${deliverTo.map(escapeHtml).join('<br>')}</p>
<p>Please confirm the delivery date by replying to this e-mail. The purchase order is attached as a PDF.</p>
<p>${escapeHtml(senderName)}, ${escapeHtml(shopName)}</p></body></html>`
  return {
    to: order.supplier?.email ?? '', subject: `Purchase order ${order.number} from ${shopName}`, text, html,
    ...(shop.replyEmail && { replyTo: shop.replyEmail }),
    ...(pdf && { attachments: [{ filename: orderPdfName(order), content: pdf, contentType: 'application/pdf' }] }),
  }
}
