// The reorder figures of every cutter type of a shop, from the last 90 days of cutting. The
// crib's reorder page and the morning tooling report both call this; the arithmetic itself
// is shared/kerf/reorder.ts.
import { sql, type SqlBool } from 'kysely'
import { reorderFigures } from '#shared/kerf/reorder'
import { reorderFormulas, reorderSentence } from '#shared/kerf/reorder-words'
import { shopDayNumber } from '#shared/kerf/dates'
import type { Queryable } from '../../db/connect'
import { shopTimeZone } from '../platform/shop-settings'

export const DEMAND_WINDOW_DAYS = 90
const DEFAULT_LEAD_TIME_DAYS = 7
const DAY_MS = 86_400_000

export async function reorderRows(db: Queryable, shopId: number, now = new Date()) {
  const windowStart = new Date(now.getTime() - DEMAND_WINDOW_DAYS * 86_400_000)
  // The window's days as the shop counts them (cut_log_daily's days), as days since
  // 1970-01-01: the 90 days that end on the shop's today.
  const lastDay = shopDayNumber(now, await shopTimeZone(db, shopId))
  const firstDay = lastDay - DEMAND_WINDOW_DAYS + 1
  const [shop, types, usage, stock, orders, atRegrind, machines] = await Promise.all([
    db.selectFrom('shops').select(['regrind_life_fraction', 'order_cost_cents', 'holding_rate', 'review_interval_days'])
      .where('id', '=', shopId).executeTakeFirstOrThrow(),
    db.selectFrom('cutter_types as t')
      .leftJoin('suppliers as s', (j) => j.onRef('s.id', '=', 't.supplier_id').onRef('s.shop_id', '=', 't.shop_id'))
      .select(['t.id', 't.name', 't.supplier_id', 's.name as supplier_name', 's.lead_time_days', 't.lead_time_days_override',
        't.max_regrinds', 't.service_level', 't.unit_cost_cents', 't.pack_size', 't.rated_life_minutes',
        't.min_on_hand', 't.max_on_hand', 't.spares_per_machine', 't.do_not_reorder'])
      .where('t.shop_id', '=', shopId).where('t.active', '=', true)
      .orderBy('t.name').execute(),
    // New-cutter lives used per type and shop day, from the daily roll-up (its trigger adds each
    // log's minutes × wear factor / rated life as the log is written), never the raw logs.
    db.selectFrom('cut_log_daily')
      .select(['type_id', sql<number>`day - date '1970-01-01'`.as('day'), sql<number>`sum(new_lives)`.as('lives')])
      .where('shop_id', '=', shopId)
      .where(sql<SqlBool>`day between date '1970-01-01' + ${firstDay}::int and date '1970-01-01' + ${lastDay}::int`)
      .groupBy(['type_id', 'day'])
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
    // Cutters out at the regrinder that should come back sharp (regrinds left), with the day
    // their batch is expected back: sent + the supplier's turnaround.
    db.selectFrom('regrind_batch_items as i')
      .innerJoin('regrind_batches as b', (j) => j.onRef('b.id', '=', 'i.batch_id').onRef('b.shop_id', '=', 'i.shop_id'))
      .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'i.cutter_id').onRef('c.shop_id', '=', 'i.shop_id'))
      .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
      .leftJoin('suppliers as s', (j) => j.onRef('s.id', '=', 'b.supplier_id').onRef('s.shop_id', '=', 'b.shop_id'))
      .select(['c.type_id', 'b.sent_at', sql<number>`coalesce(s.regrind_turnaround_days, 10)`.as('turnaround')])
      .where('i.shop_id', '=', shopId).where('b.status', '=', 'sent').where('i.result', 'is', null)
      .where('c.status', '=', 'at_regrind')
      .whereRef('c.regrind_count', '<', 't.max_regrinds')
      .execute(),
    // Machines that use each type: cut with one in the demand window or hold one now.
    db.selectFrom('cut_logs as l')
      .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'l.cutter_id').onRef('c.shop_id', '=', 'l.shop_id'))
      .select(['c.type_id', 'l.machine_id'])
      .where('l.shop_id', '=', shopId).where('l.cut_at', '>', windowStart).where('l.machine_id', 'is not', null)
      .union((eb) => eb.selectFrom('cutters').select(['type_id', 'machine_id'])
        .where('shop_id', '=', shopId).where('status', '=', 'in_spindle'))
      .execute(),
  ])

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
    const horizon = now.getTime() + leadTimeDays * DAY_MS
    const comingBack = atRegrind.filter((r) => r.type_id === t.id && r.sent_at
      && r.sent_at.getTime() + Number(r.turnaround) * DAY_MS <= horizon).length
    const machinesUsing = new Set(machines.filter((m) => m.type_id === t.id).map((m) => m.machine_id)).size
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
      atRegrind: comingBack,
      reviewDays: shop.review_interval_days,
      minOnHand: t.min_on_hand,
      maxOnHand: t.max_on_hand,
      sparesPerMachine: t.spares_per_machine,
      machinesUsing,
      doNotReorder: t.do_not_reorder,
    })
    const words = {
      ...figures, leadTimeDays, reviewDays: shop.review_interval_days, serviceLevel: t.service_level, packSize: t.pack_size,
      available: stockBy.get(t.id) ?? 0, onOrder: Number(order?.on_order ?? 0), maxOnHand: t.max_on_hand,
      sparesPerMachine: t.spares_per_machine, machinesUsing, doNotReorder: t.do_not_reorder,
    }
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
      reviewDays: shop.review_interval_days,
      minOnHand: t.min_on_hand,
      maxOnHand: t.max_on_hand,
      sparesPerMachine: t.spares_per_machine,
      machinesUsing,
      doNotReorder: t.do_not_reorder,
      ...figures,
      explanation: reorderSentence(words),
      formulas: reorderFormulas(words),
    }
  })
}
export type ReorderRow = Awaited<ReturnType<typeof reorderRows>>[number]
