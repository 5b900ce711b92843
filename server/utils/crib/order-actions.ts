// Sending a purchase order to its supplier and receiving a delivery against it: the two writes
// that move an order along, each one transaction under the order's row lock; and drafting orders
// from the reorder suggestions.
import { sql } from 'kysely'
import type { ReceiveOrderBody } from '#shared/schemas/orders'
import type { z } from 'zod'
import type { Db } from '../../db/connect'
import type { SessionUser } from '../platform/auth'
import { sendShopMail } from '../platform/shop-mail'
import { badField, fieldError } from '../platform/validation'
import { lockOrder, replaceOrderLines } from './order-lines'
import { orderPdf } from './order-pdf'
import { orderLetterhead, orderMail, orderNumber, orderView } from './orders'
import { createCutters } from './receiving'
import { reorderRows } from './reorder'

/**
 * Sends a draft order to its supplier by e-mail, with the purchase order attached as a PDF. The
 * e-mail goes out inside the transaction, so an order is marked sent only when the mail server took it. Answers the order as the crib sees it.
 */
export async function sendOrder(db: Db, user: SessionUser, id: number) {
  await db.transaction().execute(async (tx) => {
    const order = await lockOrder(tx, user.shopId, id)
    if (order.status !== 'draft') throw createError({ statusCode: 409, statusMessage: `${orderNumber(order.number)} was already sent.` })
    const view = await orderView(tx, user.shopId, id)
    if (!view.supplier?.email) {
      throw createError({ statusCode: 400, statusMessage: 'The supplier has no e-mail address. Add one in Suppliers, then send again.' })
    }
    const shop = await orderLetterhead(tx, user.shopId)
    const sentAt = new Date()
    // The address the order went out with stays on it, whatever the shop's address becomes.
    await tx.updateTable('purchase_orders').set({ status: 'sent', sent_at: sentAt, ship_to: shop.address })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    // The PDF the supplier gets is the one the order page downloads from now on.
    const pdf = await orderPdf({ ...view, status: 'sent', sentAt }, shop)
    try {
      await sendShopMail(user.shopId, 'order', orderMail(view, shop, user.name, pdf))
    } catch (err) {
      // Refused by the shop's mail rules (not confirmed, over the hour's limit): say so as it is.
      if (isError(err)) throw err
      throw createError({ statusCode: 502, statusMessage: `The mail server did not take the order: ${err instanceof Error ? err.message : err}. Nothing was sent; try again.` })
    }
  })
  return orderView(db, user.shopId, id)
}

/**
 * Receives a delivery against a sent order: the cutters are created with label codes in one
 * step, the lines count what came, and the order is received once every line is complete.
 * Answers the order, the new cutters and the label sheet to print.
 */
export async function receiveOrder(db: Db, user: SessionUser, id: number, body: z.output<typeof ReceiveOrderBody>) {
  const created = await db.transaction().execute(async (tx) => {
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
      if (!line) badField('lines', `line ${input.lineId} is not on ${orderNumber(order.number)}`)
      const open = line.quantity - line.received_quantity
      if (input.quantity > open) {
        fieldError({ [`line-${line.id}`]: `at most ${open}` }, { message: `lines: only ${open} of ${line.name} are still to come on this order` })
      }
      if (input.quantity === 0) continue
      cutters.push(...Array.from({ length: input.quantity }, () => ({
        typeId: line.type_id, diameterMm: input.diameterMm ?? line.cutting_diameter_mm, orderLineId: line.id, note: `Received on ${orderNumber(order.number)}`,
      })))
      await tx.updateTable('purchase_order_lines').set({ received_quantity: line.received_quantity + input.quantity })
        .where('shop_id', '=', user.shopId).where('id', '=', line.id).execute()
      line.received_quantity += input.quantity
    }
    if (!cutters.length) badField('lines', 'enter how many arrived on at least one line')
    const complete = lines.every((l) => l.received_quantity >= l.quantity)
    await tx.updateTable('purchase_orders')
      .set({ status: complete ? 'received' : 'partly_received', ...(complete && { received_at: new Date() }) })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    return createCutters(tx, user.shopId, user.id, cutters)
  })
  return {
    order: await orderView(db, user.shopId, id),
    cutters: created.map((c) => ({ id: c.id, code: c.code, typeId: c.type_id })),
    labelsUrl: `/labels?ids=${created.map((c) => c.id).join(',')}`,
  }
}

// The first key of the advisory lock that makes a shop's drafts from suggestions take turns.
const DRAFT_LOCK = 0x44524654

/**
 * Turns reorder suggestions into draft purchase orders, one per supplier; a supplier's open draft
 * gets the new lines instead of a second draft. Idempotent per supplier: the shop's drafts are
 * made under one lock, so pressing twice at once finds the first press's draft and sets the same
 * quantities on it again. Types without a supplier or not below their reorder point are skipped, with why.
 */
export async function draftOrdersFromSuggestions(db: Db, user: SessionUser, typeIds: number[]) {
  const rows = (await reorderRows(db, user.shopId)).filter((r) => typeIds.includes(r.typeId))
  const skipped: Array<{ typeId: number, typeName: string, reason: string }> = []
  const bySupplier = new Map<number, typeof rows>()
  for (const r of rows) {
    if (!r.supplierId) skipped.push({ typeId: r.typeId, typeName: r.typeName, reason: 'has no supplier in the catalogue' })
    else if (r.suggestedQty <= 0) skipped.push({ typeId: r.typeId, typeName: r.typeName, reason: 'is not below its reorder point' })
    else bySupplier.set(r.supplierId, [...(bySupplier.get(r.supplierId) ?? []), r])
  }
  const orderIds = await db.transaction().execute(async (tx) => {
    await sql`select pg_advisory_xact_lock(${DRAFT_LOCK}, ${user.shopId})`.execute(tx)
    const ids: number[] = []
    for (const [supplierId, suggestions] of bySupplier) {
      const draft = await tx.selectFrom('purchase_orders').select('id')
        .where('shop_id', '=', user.shopId).where('supplier_id', '=', supplierId).where('status', '=', 'draft')
        .orderBy('id', 'desc').forUpdate().executeTakeFirst()
      const orderId = draft?.id ?? (await tx.insertInto('purchase_orders')
        .values({ shop_id: user.shopId, supplier_id: supplierId, created_by: user.id, note: '' })
        .returning('id').executeTakeFirstOrThrow()).id
      const existing = await tx.selectFrom('purchase_order_lines').select(['type_id', 'quantity', 'unit_cost_cents'])
        .where('shop_id', '=', user.shopId).where('order_id', '=', orderId).execute()
      const lines = new Map(existing.map((l) => [l.type_id, { typeId: l.type_id, quantity: l.quantity, unitCostCents: l.unit_cost_cents }]))
      for (const s of suggestions) lines.set(s.typeId, { typeId: s.typeId, quantity: s.suggestedQty, unitCostCents: s.unitCostCents })
      await replaceOrderLines(tx, user.shopId, orderId, [...lines.values()])
      ids.push(orderId)
    }
    return ids
  })
  return { orderIds, skipped }
}
