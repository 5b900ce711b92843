// The reorder figures of every cutter type of a shop, from the last 90 days of cutting. The
// crib's reorder page and the morning tooling report both call this; the arithmetic itself
// is shared/kerf/reorder.ts.
import { sql } from 'kysely'
import { reorderFigures } from '#shared/kerf/reorder'
import type { Queryable } from '../../db/connect'

export const DEMAND_WINDOW_DAYS = 90
const DEFAULT_LEAD_TIME_DAYS = 7

export async function reorderRows(db: Queryable, shopId: number, now = new Date()) {
  const windowStart = new Date(now.getTime() - DEMAND_WINDOW_DAYS * 86_400_000)
  const [shop, types, usage, stock, orders] = await Promise.all([
    db.selectFrom('shops').select(['regrind_life_fraction', 'order_cost_cents', 'holding_rate'])
      .where('id', '=', shopId).executeTakeFirstOrThrow(),
    db.selectFrom('cutter_types as t')
      .leftJoin('suppliers as s', (j) => j.onRef('s.id', '=', 't.supplier_id').onRef('s.shop_id', '=', 't.shop_id'))
      .select(['t.id', 't.name', 't.supplier_id', 's.name as supplier_name', 's.lead_time_days', 't.lead_time_days_override',
        't.max_regrinds', 't.service_level', 't.unit_cost_cents', 't.pack_size', 't.rated_life_minutes'])
      .where('t.shop_id', '=', shopId).where('t.active', '=', true)
      .orderBy('t.name').execute(),
    // Lives used per type and UTC day, in new-cutter lives (minutes × wear / rated life).
    db.selectFrom('cut_logs as l')
      .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'l.cutter_id').onRef('c.shop_id', '=', 'l.shop_id'))
      .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
      .select([
        'c.type_id',
        sql<number>`floor(extract(epoch from l.cut_at) / 86400)::int`.as('day'),
        sql<number>`sum(l.minutes * l.wear_factor / t.rated_life_minutes)`.as('lives'),
      ])
      .where('l.shop_id', '=', shopId).where('l.voided_at', 'is', null)
      .where('l.cut_at', '>', windowStart).where('l.cut_at', '<=', now)
      .groupBy(['c.type_id', 'day'])
      .execute(),
    db.selectFrom('cutters').select(['type_id', (eb) => eb.fn.countAll<number>().as('n')])
      .where('shop_id', '=', shopId)
      .where('status', 'in', ['in_crib', 'in_spindle'])
      .where('life_used', '<', 1)
      .where((eb) => eb.or([eb('flagged', 'is', null), eb('flagged', '!=', 'broken')]))
      .groupBy('type_id').execute(),
    db.selectFrom('purchase_order_lines as pl')
      .innerJoin('purchase_orders as po', (j) => j.onRef('po.id', '=', 'pl.order_id').onRef('po.shop_id', '=', 'pl.shop_id'))
      .select([
        'pl.type_id',
        sql<number>`coalesce(sum(pl.quantity - pl.received_quantity) filter (where po.status in ('sent', 'partly_received')), 0)`.as('on_order'),
        sql<number>`coalesce(sum(pl.quantity) filter (where po.status = 'draft'), 0)`.as('in_draft'),
      ])
      .where('pl.shop_id', '=', shopId)
      .groupBy('pl.type_id').execute(),
  ])

  const firstDay = Math.floor(windowStart.getTime() / 86_400_000) + 1
  const stockBy = new Map(stock.map((s) => [s.type_id, Number(s.n)]))
  const ordersBy = new Map(orders.map((o) => [o.type_id, o]))
  return types.map((t) => {
    const daily = Array<number>(DEMAND_WINDOW_DAYS).fill(0)
    for (const u of usage) {
      if (u.type_id === t.id) {
        const i = u.day - firstDay
        if (i >= 0 && i < DEMAND_WINDOW_DAYS) daily[i] = (daily[i] ?? 0) + Number(u.lives)
      }
    }
    const leadTimeDays = t.lead_time_days_override ?? t.lead_time_days ?? DEFAULT_LEAD_TIME_DAYS
    const order = ordersBy.get(t.id)
    const figures = reorderFigures({
      dailyLives: daily,
      maxRegrinds: t.max_regrinds,
      regrindLifeFraction: shop.regrind_life_fraction,
      serviceLevel: t.service_level,
      leadTimeDays,
      unitCostCents: t.unit_cost_cents,
      packSize: t.pack_size,
      orderCostCents: shop.order_cost_cents,
      holdingRate: shop.holding_rate,
      available: stockBy.get(t.id) ?? 0,
      onOrder: Number(order?.on_order ?? 0),
    })
    return {
      typeId: t.id,
      typeName: t.name,
      supplierId: t.supplier_id,
      supplierName: t.supplier_name,
      leadTimeDays,
      serviceLevel: t.service_level,
      packSize: t.pack_size,
      unitCostCents: t.unit_cost_cents,
      available: stockBy.get(t.id) ?? 0,
      onOrder: Number(order?.on_order ?? 0),
      inDraft: Number(order?.in_draft ?? 0),
      ...figures,
    }
  })
}
export type ReorderRow = Awaited<ReturnType<typeof reorderRows>>[number]
