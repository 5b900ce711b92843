// Resharpening batches as the crib sees them: the list with counts and totals, and one batch
// with its cutters, diameters, results and costs. One place builds them for every route.
import { sql } from 'kysely'
import { batchAge, DEFAULT_REGRIND_TURNAROUND_DAYS, expectedDiameterMm } from '#shared/kerf/regrind'
import type { Queryable } from '../../db/connect'

/** A sent batch's age against its supplier's turnaround; null for drafts and closed batches. */
function ageOf(b: { status: string, sent_at: Date | null, turnaround: number | null }, now: Date) {
  if (b.status !== 'sent' || !b.sent_at) return null
  const turnaroundDays = b.turnaround ?? DEFAULT_REGRIND_TURNAROUND_DAYS
  return { turnaroundDays, ...batchAge(b.sent_at, turnaroundDays, now) }
}

export async function regrindBatchList(db: Queryable, shopId: number, now = new Date()) {
  const rows = await db.selectFrom('regrind_batches as b')
    .leftJoin('suppliers as s', (j) => j.onRef('s.id', '=', 'b.supplier_id').onRef('s.shop_id', '=', 'b.shop_id'))
    .leftJoin('regrind_batch_items as i', (j) => j.onRef('i.batch_id', '=', 'b.id').onRef('i.shop_id', '=', 'b.shop_id'))
    .select((eb) => [
      'b.id', 'b.number', 'b.status', 'b.note', 'b.created_at', 'b.sent_at', 'b.received_at', 's.id as supplierId', 's.name as supplierName',
      's.regrind_turnaround_days as turnaround',
      eb.fn.count<number>('i.id').as('items'),
      eb.fn.count<number>('i.id').filterWhere('i.result', 'is', null).as('out'),
      eb.fn.count<number>('i.id').filterWhere('i.scrap_reason', 'is not', null).as('scrapped'),
      eb.fn.count<number>('i.id').filterWhere('i.result', '=', 'reground').as('reground'),
      eb.fn.count<number>('i.id').filterWhere('i.result', '=', 'retired').as('retired'),
      eb.fn.coalesce(eb.fn.sum<number>('i.cost_cents'), sql<number>`0`).as('costCents'),
    ])
    .where('b.shop_id', '=', shopId)
    .groupBy(['b.id', 's.id'])
    .orderBy('b.created_at', 'desc').orderBy('b.id', 'desc')
    .execute()
  return rows.map((b) => ({
    id: b.id,
    number: b.number,
    status: b.status,
    note: b.note,
    supplier: b.supplierId === null ? null : { id: b.supplierId, name: b.supplierName ?? '' },
    createdAt: b.created_at,
    sentAt: b.sent_at,
    receivedAt: b.received_at,
    counts: { items: Number(b.items), reground: Number(b.reground), retired: Number(b.retired), scrapped: Number(b.scrapped), out: Number(b.out) },
    costCents: Number(b.costCents),
    age: ageOf(b, now),
  }))
}
export type RegrindBatchSummary = Awaited<ReturnType<typeof regrindBatchList>>[number]

export async function regrindBatchView(db: Queryable, shopId: number, id: number, now = new Date()) {
  const b = await db.selectFrom('regrind_batches as b')
    .leftJoin('suppliers as s', (j) => j.onRef('s.id', '=', 'b.supplier_id').onRef('s.shop_id', '=', 'b.shop_id'))
    .leftJoin('users as u', (j) => j.onRef('u.id', '=', 'b.created_by').onRef('u.shop_id', '=', 'b.shop_id'))
    .select(['b.id', 'b.number', 'b.ship_to', 'b.status', 'b.note', 'b.created_at', 'b.sent_at', 'b.received_at',
      's.id as supplierId', 's.name as supplierName', 's.email as supplierEmail', 's.regrind_turnaround_days as turnaround', 'u.name as createdByName'])
    .where('b.shop_id', '=', shopId).where('b.id', '=', id)
    .executeTakeFirst()
  if (!b) return undefined

  const items = await db.selectFrom('regrind_batch_items as i')
    .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'i.cutter_id').onRef('c.shop_id', '=', 'i.shop_id'))
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'c.machine_id').onRef('m.shop_id', '=', 'c.shop_id'))
    .select(['i.cutter_id', 'i.diameter_before_mm', 'i.diameter_after_mm', 'i.result', 'i.cost_cents', 'i.received_at', 'i.scrap_reason',
      'c.code', 'c.status', 'c.regrind_count', 'c.life_used', 'c.retired_reason', 'm.name as machineName',
      't.id as typeId', 't.name as typeName', 't.max_regrinds', 't.regrind_diameter_loss_mm', 't.min_usable_diameter_mm', 't.regrind_cost_cents'])
    .where('i.shop_id', '=', shopId).where('i.batch_id', '=', id)
    .orderBy('t.name').orderBy('c.code')
    .execute()

  return {
    id: b.id,
    /** Counted per shop: the shop's first batch is 1. */
    number: b.number,
    /** The shop's address as it was when the batch was sent. */
    shipTo: b.ship_to,
    status: b.status,
    note: b.note,
    supplier: b.supplierId === null ? null : { id: b.supplierId, name: b.supplierName ?? '', email: b.supplierEmail },
    createdByName: b.createdByName,
    createdAt: b.created_at,
    sentAt: b.sent_at,
    receivedAt: b.received_at,
    age: ageOf(b, now),
    items: items.map((i) => ({
      cutterId: i.cutter_id,
      code: i.code,
      typeId: i.typeId,
      typeName: i.typeName,
      status: i.status,
      machineName: i.machineName,
      lifeUsed: i.life_used,
      regrindCount: i.regrind_count,
      maxRegrinds: i.max_regrinds,
      retiredReason: i.retired_reason,
      diameterBeforeMm: i.diameter_before_mm,
      expectedDiameterMm: expectedDiameterMm(i.diameter_before_mm, i.regrind_diameter_loss_mm),
      minUsableDiameterMm: i.min_usable_diameter_mm,
      regrindCostCents: i.regrind_cost_cents,
      diameterAfterMm: i.diameter_after_mm,
      result: i.result,
      receivedAt: i.received_at,
      scrapReason: i.scrap_reason,
      costCents: i.result === null ? null : i.cost_cents,
    })),
    totals: {
      items: items.length,
      reground: items.filter((i) => i.result === 'reground').length,
      retired: items.filter((i) => i.result === 'retired').length,
      scrapped: items.filter((i) => i.scrap_reason !== null).length,
      out: items.filter((i) => i.result === null).length,
      costCents: items.reduce((sum, i) => sum + (i.result === null ? 0 : i.cost_cents), 0),
    },
  }
}
export type RegrindBatchView = NonNullable<Awaited<ReturnType<typeof regrindBatchView>>>

/** The batch, or a 404 that says so plainly. */
export async function requireRegrindBatchView(db: Queryable, shopId: number, id: number): Promise<RegrindBatchView> {
  const view = await regrindBatchView(db, shopId, id)
  if (!view) notFound('resharpening batch')
  return view
}
