// Tooling cost, spend and outcomes of a shop over a range of days, from the cut_log_daily
// roll-up (never the raw cut logs). The arithmetic is shared/kerf/cost.ts.
import { sql } from 'kysely'
import { costPerLifeCents, costRows, rate, type UsageSlice } from '#shared/kerf/cost'
import { monthsOf, type DateRange } from '#shared/kerf/date-range'
import { PROFILE_LABELS } from '#shared/kerf/geometry'
import type { CostGroup } from '#shared/schemas/insights'
import type { Queryable } from '../../db/connect'

const KEY_COLUMN = { material: 'material_id', machine: 'machine_id', operator: 'operator_id', type: 'type_id' } as const
const NO_NAME: Record<CostGroup, string> = { material: 'Unknown material', machine: 'No machine recorded', operator: 'No operator recorded', type: 'Unknown type' }

async function namesFor(db: Queryable, shopId: number, by: CostGroup): Promise<Map<number, string>> {
  const table = { material: 'materials', machine: 'machines', operator: 'users', type: 'cutter_types' } as const
  const rows = await db.selectFrom(table[by]).select(['id', 'name']).where('shop_id', '=', shopId).execute()
  return new Map(rows.map((r) => [r.id, r.name]))
}

/** Cost per life of every type of the shop, at today's catalogue prices. */
async function costPerLifeByType(db: Queryable, shopId: number) {
  const [shop, types] = await Promise.all([
    db.selectFrom('shops').select('regrind_life_fraction').where('id', '=', shopId).executeTakeFirstOrThrow(),
    db.selectFrom('cutter_types').select(['id', 'unit_cost_cents', 'regrind_cost_cents', 'max_regrinds'])
      .where('shop_id', '=', shopId).execute(),
  ])
  return new Map(types.map((t) => [t.id, costPerLifeCents(
    { unitCostCents: t.unit_cost_cents, regrindCostCents: t.regrind_cost_cents, maxRegrinds: t.max_regrinds }, shop.regrind_life_fraction)]))
}

export async function costByGroup(db: Queryable, shopId: number, range: DateRange, by: CostGroup) {
  const key = KEY_COLUMN[by]
  const [usage, names, prices] = await Promise.all([
    db.selectFrom('cut_log_daily')
      .select([
        sql<number | null>`${sql.ref(key)}`.as('key'), 'type_id',
        sql<number>`sum(minutes)`.as('minutes'), sql<number>`sum(new_lives)`.as('new_lives'),
      ])
      .where('shop_id', '=', shopId).where('day', '>=', range.from).where('day', '<=', range.to)
      .groupBy([sql.ref(key), 'type_id'])
      .execute(),
    namesFor(db, shopId, by),
    costPerLifeByType(db, shopId),
  ])
  const slices: UsageSlice[] = usage.map((u) => ({
    key: u.key ?? 'none', name: (u.key !== null && names.get(u.key)) || NO_NAME[by],
    typeId: u.type_id, minutes: Number(u.minutes), newLives: Number(u.new_lives),
  }))
  return costRows(slices, prices)
}

/** Tooling spend by the shop's month: cutters received (at their order line's price, else the catalogue's) and regrinds received back. */
export async function spendByMonth(db: Queryable, shopId: number, range: DateRange) {
  const [bought, reground] = await Promise.all([
    db.selectFrom('cutters as c')
      .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
      .leftJoin('purchase_order_lines as pl', (j) => j.onRef('pl.id', '=', 'c.order_line_id').onRef('pl.shop_id', '=', 'c.shop_id'))
      .select([
        sql<string>`to_char(c.received_at at time zone ${range.timeZone}, 'YYYY-MM')`.as('month'),
        sql<number>`sum(coalesce(pl.unit_cost_cents, t.unit_cost_cents))`.as('cents'),
        sql<number>`count(*)`.as('count'),
      ])
      .where('c.shop_id', '=', shopId).where('c.received_at', '>=', range.start).where('c.received_at', '<', range.end)
      .groupBy('month').execute(),
    db.selectFrom('regrind_batch_items as i')
      .innerJoin('regrind_batches as b', (j) => j.onRef('b.id', '=', 'i.batch_id').onRef('b.shop_id', '=', 'i.shop_id'))
      .select([
        sql<string>`to_char(b.received_at at time zone ${range.timeZone}, 'YYYY-MM')`.as('month'),
        sql<number>`sum(i.cost_cents)`.as('cents'),
        sql<number>`count(*) filter (where i.result = 'reground')`.as('count'),
      ])
      .where('i.shop_id', '=', shopId).where('b.status', '=', 'received')
      .where('b.received_at', '>=', range.start).where('b.received_at', '<', range.end)
      .groupBy('month').execute(),
  ])
  const newBy = new Map(bought.map((r) => [r.month, r]))
  const regrindBy = new Map(reground.map((r) => [r.month, r]))
  return monthsOf(range).map((month) => {
    const n = newBy.get(month)
    const r = regrindBy.get(month)
    const newCents = Number(n?.cents ?? 0)
    const regrindCents = Number(r?.cents ?? 0)
    return {
      month, newCents, regrindCents, totalCents: newCents + regrindCents,
      cuttersBought: Number(n?.count ?? 0), cuttersReground: Number(r?.count ?? 0),
    }
  })
}

/** Outcomes of the cuts (and breakage) by material and by bit profile. */
export async function outcomes(db: Queryable, shopId: number, range: DateRange) {
  const tally = (group: 'material' | 'profile') => db.selectFrom('cut_log_daily as d')
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'd.type_id').onRef('t.shop_id', '=', 'd.shop_id'))
    .innerJoin('materials as m', (j) => j.onRef('m.id', '=', 'd.material_id').onRef('m.shop_id', '=', 'd.shop_id'))
    .select([
      group === 'material' ? sql<string>`m.id::text`.as('key') : sql<string>`t.profile`.as('key'),
      group === 'material' ? sql<string>`min(m.name)`.as('name') : sql<string>`t.profile`.as('name'),
      sql<number>`sum(d.logs)`.as('logs'), sql<number>`sum(d.minutes)`.as('minutes'),
      sql<number>`sum(d.clean)`.as('clean'), sql<number>`sum(d.melted)`.as('melted'), sql<number>`sum(d.fuzzy)`.as('fuzzy'),
      sql<number>`sum(d.chip_out)`.as('chip_out'), sql<number>`sum(d.broken)`.as('broken'),
    ])
    .where('d.shop_id', '=', shopId).where('d.day', '>=', range.from).where('d.day', '<=', range.to)
    .groupBy(group === 'material' ? 'm.id' : 't.profile')
    .execute()
  const [byMaterial, byProfile] = await Promise.all([tally('material'), tally('profile')])
  const shape = (r: Awaited<ReturnType<typeof tally>>[number], name: string) => {
    const logs = Number(r.logs)
    return {
      key: r.key, name, logs, cutHours: Math.round(Number(r.minutes) / 60 * 100) / 100,
      clean: Number(r.clean), melted: Number(r.melted), fuzzy: Number(r.fuzzy), chipOut: Number(r.chip_out), broken: Number(r.broken),
      breakageRate: rate(Number(r.broken), logs), troubleRate: rate(Number(r.melted) + Number(r.fuzzy) + Number(r.chip_out), logs),
    }
  }
  const all = byMaterial.reduce((s, r) => ({ logs: s.logs + Number(r.logs), broken: s.broken + Number(r.broken) }), { logs: 0, broken: 0 })
  return {
    logs: all.logs,
    broken: all.broken,
    breakageRate: rate(all.broken, all.logs),
    byMaterial: byMaterial.map((r) => shape(r, r.name)).sort((a, b) => a.name.localeCompare(b.name)),
    byProfile: byProfile.map((r) => shape(r, PROFILE_LABELS[r.key as keyof typeof PROFILE_LABELS] ?? r.key)).sort((a, b) => a.name.localeCompare(b.name)),
  }
}
export type CostRowView = Awaited<ReturnType<typeof costByGroup>>[number]
export type SpendMonth = Awaited<ReturnType<typeof spendByMonth>>[number]
export type Outcomes = Awaited<ReturnType<typeof outcomes>>
