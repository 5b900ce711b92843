// The cutter as the phone page and the crib see it: type, state, life and remaining minutes
// in the shop's materials, and the last few cut logs. One place builds it for every route.
import { dueAction, dueReason } from '#shared/kerf/due'
import { remainingMinutes } from '#shared/kerf/life'
import { PREPARED, type Queryable } from '../../db/connect'

const RECENT_CUTS = 5

export async function cutterView(db: Queryable, shopId: number, where: { id: number } | { code: string }) {
  let query = db.selectFrom('cutters as c')
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .innerJoin('shops as s', 's.id', 'c.shop_id')
    .leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'c.machine_id').onRef('m.shop_id', '=', 'c.shop_id'))
    .select([
      'c.id', 'c.code', 'c.status', 'c.machine_id', 'c.regrind_count', 'c.diameter_mm', 'c.life_used', 'c.life_scale',
      'c.minutes_total', 'c.minutes_this_life', 'c.flagged', 'c.flagged_at', 'c.retired_reason', 'c.received_at',
      'm.name as machine_name', 's.life_threshold', 's.shift_minutes',
      't.id as type_id', 't.name as type_name', 't.rated_life_minutes', 't.flutes', 't.cutting_diameter_mm', 't.shank_diameter_mm',
      't.helix', 't.profile', 't.v_angle_deg', 't.tool_material', 't.max_regrinds', 't.regrind_diameter_loss_mm', 't.min_usable_diameter_mm',
      // The type's longest logged cut (kept by a trigger on the logs), against which the cut form weighs a new one.
      't.longest_cut_minutes',
    ])
    .where('c.shop_id', '=', shopId)
  query = 'id' in where ? query.where('c.id', '=', where.id) : query.where('c.code', '=', where.code)
  // Prepared, as the log-a-cut statements are: every cutter page and every logged cut reads these.
  const c = await query.modifyEnd(PREPARED).executeTakeFirst()
  if (!c) return undefined

  const [materials, cuts] = await Promise.all([
    db.selectFrom('materials').select(['id', 'name', 'wear_factor', 'common'])
      .where('shop_id', '=', shopId).where('active', '=', true)
      .orderBy('common', 'desc').orderBy('name').modifyEnd(PREPARED).execute(),
    db.selectFrom('cut_logs as l')
      .innerJoin('materials as mt', (j) => j.onRef('mt.id', '=', 'l.material_id').onRef('mt.shop_id', '=', 'l.shop_id'))
      .leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'l.machine_id').onRef('m.shop_id', '=', 'l.shop_id'))
      .leftJoin('users as u', 'u.id', 'l.operator_id')
      .select(['l.id', 'l.cut_at', 'l.created_at', 'l.minutes', 'l.outcome', 'l.rpm', 'l.feed_mm_per_min', 'l.note',
        'l.material_id', 'l.operator_id', 'mt.name as material_name', 'm.name as machine_name', 'u.name as operator_name'])
      .where('l.shop_id', '=', shopId).where('l.cutter_id', '=', c.id).where('l.voided_at', 'is', null)
      .orderBy('l.cut_at', 'desc').orderBy('l.id', 'desc')
      .limit(RECENT_CUTS)
      .modifyEnd(PREPARED)
      .execute(),
  ])

  const forDue = { status: c.status, lifeUsed: c.life_used, flagged: c.flagged, regrindCount: c.regrind_count, diameterMm: c.diameter_mm }
  const reason = dueReason(forDue, c.life_threshold)
  return {
    id: c.id,
    code: c.code,
    status: c.status,
    machine: c.machine_id === null ? null : { id: c.machine_id, name: c.machine_name ?? '' },
    regrindCount: c.regrind_count,
    diameterMm: c.diameter_mm,
    lifeUsed: c.life_used,
    lifeScale: c.life_scale,
    minutesTotal: c.minutes_total,
    minutesThisLife: c.minutes_this_life,
    flagged: c.flagged,
    flaggedAt: c.flagged_at,
    retiredReason: c.retired_reason,
    receivedAt: c.received_at,
    lifeThreshold: c.life_threshold,
    /** What the cut form weighs a new log's minutes against. */
    usual: { shiftMinutes: c.shift_minutes, longestCutMinutes: c.longest_cut_minutes },
    due: reason && {
      reason,
      action: dueAction(forDue, {
        maxRegrinds: c.max_regrinds, regrindDiameterLossMm: c.regrind_diameter_loss_mm, minUsableDiameterMm: c.min_usable_diameter_mm,
      }),
    },
    type: {
      id: c.type_id,
      name: c.type_name,
      ratedLifeMinutes: c.rated_life_minutes,
      flutes: c.flutes,
      cuttingDiameterMm: c.cutting_diameter_mm,
      shankDiameterMm: c.shank_diameter_mm,
      helix: c.helix,
      profile: c.profile,
      vAngleDeg: c.v_angle_deg,
      toolMaterial: c.tool_material,
      maxRegrinds: c.max_regrinds,
    },
    remainingMinutes: materials.map((m) => ({
      materialId: m.id,
      materialName: m.name,
      common: m.common,
      minutes: Math.round(remainingMinutes(c.life_used, c.rated_life_minutes, m.wear_factor, c.life_scale) * 10) / 10,
    })),
    recentCuts: cuts.map((l) => ({
      id: l.id,
      cutAt: l.cut_at,
      /** When it was logged: its operator may correct it for 24 hours from then. */
      loggedAt: l.created_at,
      minutes: l.minutes,
      materialId: l.material_id,
      materialName: l.material_name,
      operatorId: l.operator_id,
      machineName: l.machine_name,
      operatorName: l.operator_name,
      outcome: l.outcome,
      rpm: l.rpm,
      feedMmPerMin: l.feed_mm_per_min,
      note: l.note,
    })),
  }
}
export type CutterView = NonNullable<Awaited<ReturnType<typeof cutterView>>>

/** The cutter, or a 404 that says so plainly. */
export async function requireCutterView(db: Queryable, shopId: number, where: { id: number } | { code: string }): Promise<CutterView> {
  const view = await cutterView(db, shopId, where)
  if (!view) {
    throw createError({
      statusCode: 404,
      statusMessage: 'code' in where ? `No cutter has the label code ${where.code} in your shop.` : 'No such cutter in your shop.',
    })
  }
  return view
}
