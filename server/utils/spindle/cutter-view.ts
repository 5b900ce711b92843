// The cutter as the phone page and the crib see it: type, state, life and remaining minutes
// in the shop's materials, and the last few cut logs. One place builds it for every route.
import { RECENT_CUTS } from '#shared/kerf/cut-answer'
import { dueAction, dueReason } from '#shared/kerf/due'
import { remainingInMaterials } from '#shared/kerf/life'
import { sql } from 'kysely'
import { jsonArrayFrom } from 'kysely/helpers/postgres'
import { PREPARED, type Queryable } from '../../db/connect'

/**
 * The cutter's state as the view shows it: the cutter with its type, shop and machine, without the
 * lists. Logging a cut extends it with what the log needs, so that the cut's answer costs no read
 * of its own.
 */
export function cutterStateQuery(db: Queryable, shopId: number) {
  return db.selectFrom('cutters as c')
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
}
export type CutterStateRow = NonNullable<Awaited<ReturnType<ReturnType<typeof cutterStateQuery>['executeTakeFirst']>>>

/**
 * The cutter view's read: the cutter's state with the shop's active materials and the cutter's
 * last few counting logs as JSON, in one statement.
 */
export function cutterViewQuery(db: Queryable, shopId: number) {
  return cutterStateQuery(db, shopId)
    // Constants are written into the text, not sent as parameters: the statement is prepared, and
    // PostgreSQL's generic plan for a parameter limit read every log of the cutter (4× the time).
    .select((eb) => [
      jsonArrayFrom(eb.selectFrom('materials as mt').select(['mt.id', 'mt.name', 'mt.wear_factor', 'mt.common'])
        .whereRef('mt.shop_id', '=', 'c.shop_id').where('mt.active', '=', sql.lit(true))
        .orderBy('mt.common', 'desc').orderBy('mt.name')).as('materials'),
      jsonArrayFrom(eb.selectFrom('cut_logs as l')
        .innerJoin('materials as lm', (j) => j.onRef('lm.id', '=', 'l.material_id').onRef('lm.shop_id', '=', 'l.shop_id'))
        .leftJoin('machines as lmc', (j) => j.onRef('lmc.id', '=', 'l.machine_id').onRef('lmc.shop_id', '=', 'l.shop_id'))
        .leftJoin('users as u', 'u.id', 'l.operator_id')
        .select(['l.id', 'l.cut_at', 'l.created_at', 'l.minutes', 'l.outcome', 'l.rpm', 'l.feed_mm_per_min', 'l.note',
          'l.material_id', 'l.operator_id', 'lm.name as material_name', 'lmc.name as machine_name', 'u.name as operator_name'])
        .whereRef('l.shop_id', '=', 'c.shop_id').whereRef('l.cutter_id', '=', 'c.id').where('l.voided_at', 'is', null)
        .orderBy('l.cut_at', 'desc').orderBy('l.id', 'desc')
        .limit(sql.lit(RECENT_CUTS))).as('cuts'),
    ])
}
export type CutterViewRow = NonNullable<Awaited<ReturnType<ReturnType<typeof cutterViewQuery>['executeTakeFirst']>>>
/** A recent log as the view's read gives it: inside JSON the times arrive as text. */
export type RecentCutRow = Omit<CutterViewRow['cuts'][number], 'cut_at' | 'created_at'> & { cut_at: string | Date, created_at: string | Date }

export async function cutterView(db: Queryable, shopId: number, where: { id: number } | { code: string }) {
  const query = cutterViewQuery(db, shopId)
  // Prepared, as the log-a-cut statements are: every cutter page reads it.
  const c = await ('id' in where ? query.where('c.id', '=', where.id) : query.where('c.code', '=', where.code))
    .modifyEnd(PREPARED).executeTakeFirst()
  return c && toCutterView(c)
}

/** The cutter as the pages show it, from the view's read. */
export function toCutterView(c: CutterViewRow) {
  return {
    ...toCutterState(c),
    remainingMinutes: remainingInMaterials(c.materials.map((m) => ({ ...m, wearFactor: m.wear_factor })), c.life_used, c.rated_life_minutes, c.life_scale),
    recentCuts: c.cuts.map(toRecentCut),
  }
}

/** The cutter view without its lists: what a logged cut's answer carries with the new log. */
export function toCutterState(c: CutterStateRow) {
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
  }
}

/** A recent log as the view lists it. */
export function toRecentCut(l: RecentCutRow) {
  return {
    id: l.id,
    cutAt: new Date(l.cut_at),
    /** When it was logged: its operator may correct it for 24 hours from then. */
    loggedAt: new Date(l.created_at),
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
  }
}
export type CutterView = ReturnType<typeof toCutterView>
/** What a logged cut's answer carries: the view's state, and the logs to put among its recent ones. */
export type CutterAfterCut = ReturnType<typeof toCutterState> & { recentCuts: Array<ReturnType<typeof toRecentCut>> }

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
