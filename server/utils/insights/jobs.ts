// Tooling cost per job reference from the logged runs of NC programs, over a range of days.
import { sql } from 'kysely'
import { costPerLifeCents } from '#shared/kerf/cost'
import type { DateRange } from '#shared/kerf/date-range'
import { jobCostRows } from '#shared/kerf/nc/job-cost'
import type { Queryable } from '../../db/connect'

export async function costByJob(db: Queryable, shopId: number, range: DateRange) {
  const inRange = sql<boolean>`r.created_at >= ${range.start} and r.created_at < ${range.end}`
  const [usage, runs, shop, types] = await Promise.all([
    db.selectFrom('nc_runs as r')
      .innerJoin('nc_run_logs as rl', (j) => j.onRef('rl.run_id', '=', 'r.id').onRef('rl.shop_id', '=', 'r.shop_id'))
      .innerJoin('cut_logs as l', (j) => j.onRef('l.id', '=', 'rl.cut_log_id').onRef('l.shop_id', '=', 'r.shop_id'))
      .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'l.cutter_id').onRef('c.shop_id', '=', 'r.shop_id'))
      .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'r.shop_id'))
      .select(['r.job_ref', 'c.type_id', 'l.minutes', 'l.wear_factor', 't.rated_life_minutes'])
      .where('r.shop_id', '=', shopId).where(inRange).execute(),
    db.selectFrom('nc_runs as r').select(['r.job_ref', sql<number>`count(*)::int`.as('runs'), sql<number>`sum(r.repeats)::int`.as('sheets')])
      .where('r.shop_id', '=', shopId).where(inRange).groupBy('r.job_ref').execute(),
    db.selectFrom('shops').select('regrind_life_fraction').where('id', '=', shopId).executeTakeFirstOrThrow(),
    db.selectFrom('cutter_types').select(['id', 'unit_cost_cents', 'regrind_cost_cents', 'max_regrinds']).where('shop_id', '=', shopId).execute(),
  ])
  const prices = new Map(types.map((t) => [t.id, costPerLifeCents(
    { unitCostCents: t.unit_cost_cents, regrindCostCents: t.regrind_cost_cents, maxRegrinds: t.max_regrinds }, shop.regrind_life_fraction)]))
  return jobCostRows(
    usage.map((u) => ({ jobRef: u.job_ref, typeId: u.type_id, minutes: u.minutes, wearFactor: u.wear_factor, ratedLifeMinutes: u.rated_life_minutes })),
    new Map(runs.map((r) => [r.job_ref, { runs: r.runs, sheets: r.sheets }])),
    prices,
  )
}
