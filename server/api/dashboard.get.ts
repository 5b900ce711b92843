// The home page's figures: cutters by status, the ones due for attention, and recent cutting.
// Operators also see what they have loaded; everyone sees the same due list.
import { sql } from 'kysely'
import { dueAction, dueReason, DUE_STATUSES } from '#shared/kerf/due'

const STATUSES = ['in_crib', 'in_spindle', 'at_regrind', 'retired', 'lost'] as const

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const db = useDb()
  const shop = await db.selectFrom('shops').select(['life_threshold']).where('id', '=', user.shopId).executeTakeFirstOrThrow()

  const [byStatusRows, dueRows, recent, loaded] = await Promise.all([
    db.selectFrom('cutters').select(['status', (eb) => eb.fn.countAll<number>().as('n')])
      .where('shop_id', '=', user.shopId).groupBy('status').execute(),
    db.selectFrom('cutters as c')
      .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
      .leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'c.machine_id').onRef('m.shop_id', '=', 'c.shop_id'))
      .select(['c.id', 'c.code', 'c.status', 'c.life_used', 'c.flagged', 'c.regrind_count', 'c.diameter_mm',
        't.name as typeName', 't.max_regrinds', 't.regrind_diameter_loss_mm', 't.min_usable_diameter_mm', 'm.name as machineName'])
      .where('c.shop_id', '=', user.shopId)
      .where('c.status', 'in', [...DUE_STATUSES])
      .where((eb) => eb.or([eb('c.flagged', '=', 'dull'), eb('c.life_used', '>=', shop.life_threshold)]))
      .orderBy('c.life_used', 'desc')
      .execute(),
    db.selectFrom('cut_logs')
      .select([(eb) => eb.fn.countAll<number>().as('logs'), (eb) => eb.fn.coalesce(eb.fn.sum<number>('minutes'), sql<number>`0`).as('minutes')])
      .where('shop_id', '=', user.shopId)
      .where('cut_at', '>=', sql<Date>`now() - interval '30 days'`)
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

  const byStatus = Object.fromEntries(STATUSES.map((s) => [s, 0])) as Record<(typeof STATUSES)[number], number>
  for (const row of byStatusRows) byStatus[row.status] = Number(row.n)

  const due = dueRows.map((c) => {
    const cutter = { status: c.status, lifeUsed: c.life_used, flagged: c.flagged, regrindCount: c.regrind_count, diameterMm: c.diameter_mm }
    return {
      id: c.id,
      code: c.code,
      typeName: c.typeName,
      status: c.status,
      machineName: c.machineName,
      lifeUsed: c.life_used,
      reason: dueReason(cutter, shop.life_threshold),
      action: dueAction(cutter, {
        maxRegrinds: c.max_regrinds, regrindDiameterLossMm: c.regrind_diameter_loss_mm, minUsableDiameterMm: c.min_usable_diameter_mm,
      }),
    }
  })

  return {
    byStatus,
    lifeThreshold: shop.life_threshold,
    due,
    last30Days: { logs: Number(recent.logs), minutes: Number(recent.minutes) },
    myLoaded: loaded.map((c) => ({ id: c.id, code: c.code, typeName: c.typeName, machineName: c.machineName, lifeUsed: c.life_used })),
  }
})
