// Turn reorder suggestions into draft purchase orders, one per supplier; a supplier's open
// draft gets the new lines instead of a second draft. Idempotent per supplier: the shop's drafts
// are made under one lock, so pressing twice at once finds the first press's draft and sets the
// same quantities on it again.
import { sql } from 'kysely'
import { FromSuggestionsBody } from '#shared/schemas/orders'

// The first key of the advisory lock that makes a shop's drafts from suggestions take turns.
const DRAFT_LOCK = 0x44524654

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { typeIds } = await readValidatedBody(event, parseWith(FromSuggestionsBody))
  const rows = (await reorderRows(useDb(), user.shopId)).filter((r) => typeIds.includes(r.typeId))
  const skipped: Array<{ typeId: number, typeName: string, reason: string }> = []
  const bySupplier = new Map<number, typeof rows>()
  for (const r of rows) {
    if (!r.supplierId) skipped.push({ typeId: r.typeId, typeName: r.typeName, reason: 'has no supplier in the catalogue' })
    else if (r.suggestedQty <= 0) skipped.push({ typeId: r.typeId, typeName: r.typeName, reason: 'is not below its reorder point' })
    else bySupplier.set(r.supplierId, [...(bySupplier.get(r.supplierId) ?? []), r])
  }
  const orderIds = await transaction(async (tx) => {
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
  setResponseStatus(event, orderIds.length ? 201 : 200)
  return { orderIds, skipped }
})
