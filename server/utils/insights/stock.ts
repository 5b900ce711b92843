// The reorder figures explained to the owner: money tied up in stock per cutter type (sharp
// cutters in the crib and spindles × unit cost) and stock-out days in the last year.
import { sql } from 'kysely'
import { stockOutDays } from '#shared/kerf/stock-outs'
import { shopDayNumber } from '#shared/kerf/dates'
import type { Queryable } from '../../db/connect'
import { shopTimeZone } from '../platform/shop-settings'

const DAY_MS = 86_400_000
/** A day number (days since 1970-01-01) as 'YYYY-MM-DD'. */
const dayText = (n: number) => new Date(n * DAY_MS).toISOString().slice(0, 10)

/** Stock-out days are the shop's days, as its cut_log_daily roll-up counts them. */
export async function stockInsight(db: Queryable, shopId: number, now = new Date()) {
  const timeZone = await shopTimeZone(db, shopId)
  const dayOf = (at: Date) => shopDayNumber(at, timeZone)
  const toDay = dayOf(now)
  const fromDay = toDay - 364
  const [types, stock, changes, typeMaterials, materialDays] = await Promise.all([
    db.selectFrom('cutter_types').select(['id', 'name', 'unit_cost_cents', 'do_not_reorder'])
      .where('shop_id', '=', shopId).where('active', '=', true).orderBy('name').execute(),
    db.selectFrom('cutters').select(['type_id', (eb) => eb.fn.countAll<number>().as('n')])
      .where('shop_id', '=', shopId).where('status', 'in', ['in_crib', 'in_spindle'])
      .groupBy('type_id').execute(),
    db.selectFrom('cutter_events as e')
      .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'e.cutter_id').onRef('c.shop_id', '=', 'e.shop_id'))
      .select(['c.type_id', 'e.created_at', 'e.from_status', 'e.to_status'])
      .where('e.shop_id', '=', shopId)
      .where((eb) => eb.or([eb('e.from_status', 'is not', null), eb('e.to_status', 'is not', null)]))
      .whereRef('e.from_status', 'is distinct from', 'e.to_status')
      .execute(),
    db.selectFrom('cut_log_daily').select(['type_id', 'material_id']).distinct()
      .where('shop_id', '=', shopId).execute(),
    db.selectFrom('cut_log_daily').select(['material_id', sql<string>`day::text`.as('day')]).distinct()
      .where('shop_id', '=', shopId).where('day', '>=', sql<string>`${dayText(fromDay)}::date`)
      .execute(),
  ])
  const stockBy = new Map(stock.map((s) => [s.type_id, Number(s.n)]))
  const daysByMaterial = new Map<number, Set<number>>()
  for (const r of materialDays) {
    const day = Math.floor(Date.parse(`${r.day}T00:00:00Z`) / DAY_MS)
    if (!daysByMaterial.has(r.material_id)) daysByMaterial.set(r.material_id, new Set())
    daysByMaterial.get(r.material_id)!.add(day)
  }
  const rows = types.map((t) => {
    const cuttingDays = new Set<number>()
    for (const tm of typeMaterials) if (tm.type_id === t.id) for (const d of daysByMaterial.get(tm.material_id) ?? []) cuttingDays.add(d)
    const history = changes.filter((c) => c.type_id === t.id).map((c) => ({ at: c.created_at, from: c.from_status, to: c.to_status }))
    const inStock = stockBy.get(t.id) ?? 0
    return {
      typeId: t.id,
      typeName: t.name,
      inStock,
      unitCostCents: t.unit_cost_cents,
      tiedUpCents: inStock * t.unit_cost_cents,
      stockOutDays: stockOutDays(history, cuttingDays, fromDay, toDay, dayOf),
      doNotReorder: t.do_not_reorder,
    }
  })
  return {
    from: dayText(fromDay),
    to: dayText(toDay),
    totalTiedUpCents: rows.reduce((s, r) => s + r.tiedUpCents, 0),
    rows,
  }
}
