// The home page's figures: cutters by status, the ones due for attention, and recent cutting.
// Operators also see what they have loaded; everyone sees the same due list (server/utils/crib/due.ts).
import { sql } from 'kysely'
import { CUTTER_STATUSES, type CutterStatus } from '#shared/kerf/status'

/** The shop's midnight `days` days before its today (the last 30 days are today and the 29 before). */
const shopDaysAgo = (shopId: number, days: number) => sql<Date>`(select ((now() at time zone s.time_zone)::date - ${days}::int)::timestamp
  at time zone s.time_zone from shops s where s.id = ${shopId})`

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const db = useDb()
  const [byStatusRows, due, recent, loaded] = await Promise.all([
    db.selectFrom('cutters').select(['status', (eb) => eb.fn.countAll<number>().as('n')])
      .where('shop_id', '=', user.shopId).groupBy('status').execute(),
    dueCutters(db, user.shopId),
    db.selectFrom('cut_logs')
      .select([(eb) => eb.fn.countAll<number>().as('logs'), (eb) => eb.fn.coalesce(eb.fn.sum<number>('minutes'), sql<number>`0`).as('minutes')])
      .where('shop_id', '=', user.shopId).where('voided_at', 'is', null)
      .where('cut_at', '>=', shopDaysAgo(user.shopId, 29))
      .executeTakeFirstOrThrow(),
    db.selectFrom('cutter_events as e')
      .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'e.cutter_id').onRef('c.shop_id', '=', 'e.shop_id'))
      .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
      .leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'c.machine_id').onRef('m.shop_id', '=', 'c.shop_id'))
      .select(['c.id', 'c.code', 'c.life_used', 't.name as typeName', 'm.name as machineName'])
      .distinctOn('c.id')
      .where('e.shop_id', '=', user.shopId)
      .where('e.kind', '=', 'loaded')
      .where('e.actor_id', '=', user.id)
      .where('c.status', '=', 'in_spindle')
      .orderBy('c.id').orderBy('e.created_at', 'desc')
      .execute(),
  ])

  const byStatus = Object.fromEntries(CUTTER_STATUSES.map((s) => [s, 0])) as Record<CutterStatus, number>
  for (const row of byStatusRows) byStatus[row.status] = Number(row.n)

  return {
    byStatus,
    lifeThreshold: due.lifeThreshold,
    due: due.cutters,
    last30Days: { logs: Number(recent.logs), minutes: Number(recent.minutes) },
    myLoaded: loaded.map((c) => ({ id: c.id, code: c.code, typeName: c.typeName, machineName: c.machineName, lifeUsed: c.life_used })),
  }
})
