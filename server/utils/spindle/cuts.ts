// Logging a cut. The log, the cutter's life and minute totals, and the event are written by one
// statement (so together or not at all); the client's idempotency key makes a retry (after a
// dropped connection, or from the phone's queue) return the first log instead of counting twice.
// A new log is two statements, both prepared once per connection and neither inside an explicit
// transaction: one read (the cutter's state as the pages show it, the material, the machine and
// any log already sent with this key) and one that writes the log, the totals and the event if the
// cutter is still as read, and answers the new totals. Holding no transaction open between them
// keeps PostgreSQL's connections from waiting on the app, which was most of a log's time under load.
// The answer carries the cutter's new state and the new log as its page lists them, not the whole
// view: the page puts them into the view it has (shared/kerf/cut-answer.ts), so the shop's
// materials and the cutter's earlier logs are not read again with every log.
import { sql } from 'kysely'
import { lifeAdded, roundLife } from '#shared/kerf/life'
import type { CutLogBody } from '#shared/schemas/spindle'
import type { z } from 'zod'
import type { Selectable } from 'kysely'
import { PREPARED, type Db } from '../../db/connect'
import { reusableQuery } from '../../db/reusable'
import type { CutterStatus } from '../../db/schema'
import type { CutLogsTable } from '../../db/tables/spindle'
import { notFound, type SessionUser } from '../platform/auth'
import { badField, isUniqueViolation } from '../platform/validation'
import { cutterStateQuery, requireCutterView, toCutterState, toRecentCut, type CutterAfterCut } from './cutter-view'
import { eventRow, STATUS_SENTENCE } from './spindle'

type CutLogInput = z.output<typeof CutLogBody>

const LOG_COLUMNS = ['id', 'cutter_id', 'machine_id', 'operator_id', 'material_id', 'minutes', 'wear_factor', 'life_added',
  'rpm', 'feed_mm_per_min', 'outcome', 'cleanup_minutes_per_part', 'note', 'idempotency_key', 'cut_at', 'created_at'] as const
const EVENT_COLUMNS = ['shop_id', 'cutter_id', 'kind', 'from_status', 'to_status', 'machine_id', 'actor_id', 'note', 'photo_id'] as const
const KEY_USED = 'This idempotency key was already used for another cutter. Send the log with a new key.'
// life_added and life_used are numeric(10,6), at most 9999.999999 lives. Only a rated life
// entered far too short gets near that; the figures stop at the column's limit instead of
// failing the log (the cutter is long due by then).
const MAX_LIVES = 9999

/**
 * The cutter's state as the pages show it (404 when not in the shop), with what the log needs:
 * the material, the machine named in the log, and any log already sent with the key. The state
 * read here is the one the answer shows, updated with what the write returns.
 */
const readForLogQuery = reusableQuery(
  (db, v: { shopId: number, id: number, materialId: number, idempotencyKey: string, machineId: number | null }) => cutterStateQuery(db, v.shopId)
    .leftJoin('materials as mat', (j) => j.onRef('mat.shop_id', '=', 'c.shop_id').on('mat.id', '=', v.materialId).on('mat.active', '=', sql.lit(true)))
    .leftJoin('cut_logs as e', (j) => j.onRef('e.shop_id', '=', 'c.shop_id').on('e.idempotency_key', '=', v.idempotencyKey))
    .select(['mat.id as material_id', 'mat.name as material_name', 'mat.wear_factor', 'e.id as earlier_id'])
    // Null when the log names no machine, or one not in the shop.
    .select((eb) => eb.selectFrom('machines as mc').select('mc.name')
      .whereRef('mc.shop_id', '=', 'c.shop_id').where('mc.id', '=', v.machineId).as('log_machine_name'))
    .where('c.id', '=', v.id)
    .modifyEnd(PREPARED))

async function readForLog(db: Db, shopId: number, id: number, body: CutLogInput) {
  const { rows: [row] } = await readForLogQuery(db, {
    shopId, id, materialId: body.materialId, idempotencyKey: body.idempotencyKey, machineId: body.machineId ?? null,
  })
  if (!row) notFound('cutter')
  return row
}

/**
 * A cut belongs to a time the cutter was in a spindle: now, or at the cut's time (a log that
 * waited on a phone, or one whose bit was taken out while the request was on its way), by the last
 * change of status the cutter's events record at or before it. Anything else is a 409: a bit at
 * the regrinder, retired or lost cuts nothing. Only a cutter not in a spindle now costs the read.
 */
async function assertWasLoaded(db: Db, shopId: number, id: number, cutter: { code: string, status: CutterStatus }, cutAt: Date, sentWithTime: boolean) {
  if (cutter.status === 'in_spindle') return
  const then = await db.selectFrom('cutter_events').select('to_status')
    .where('shop_id', '=', shopId).where('cutter_id', '=', id).where('to_status', 'is not', null)
    .where('created_at', '<=', cutAt)
    .orderBy('created_at', 'desc').orderBy('id', 'desc').limit(1)
    .executeTakeFirst()
  if (then?.to_status === 'in_spindle') return
  throw createError({
    statusCode: 409,
    statusMessage: sentWithTime
      ? `Cutter ${cutter.code} was not loaded in a machine at the time of this cut, and it ${STATUS_SENTENCE[cutter.status]}: a cut can only be logged for a time the cutter was in a spindle.`
      : `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]}: a cut can only be logged on a cutter loaded in a machine. Load it first.`,
    data: { status: cutter.status },
  })
}

interface WriteValues {
  shopId: number, id: number, status: CutterStatus, regrindCount: number, lifeScale: number, added: number, minutes: number, now: Date,
  broken: boolean, machineId: number | null, operatorId: number, materialId: number, wearFactor: number, rpm: number | null,
  feedMmPerMin: number | null, outcome: CutLogInput['outcome'], cleanupMinutesPerPart: number | null, note: string,
  idempotencyKey: string, cutAt: Date, events: string
}
/**
 * The log, the cutter's totals and the events in one statement, on condition that the cutter is
 * still as read (see tryLogCut); it answers the log with the cutter's new totals, or no row. One
 * text for every log: a break (which retires the cutter) is a value, and the events (one, or two
 * with a break) arrive as a JSON list.
 */
const writeLog = reusableQuery((db, v: WriteValues) => {
  const ifBroken = <T>(then: unknown, column: string) => sql<T>`case when ${v.broken}::boolean then ${then} else ${sql.ref(column)} end`
  return db
    .with('cutter', (db) => db.updateTable('cutters')
      .set({
        life_used: sql`least(life_used + ${v.added}, ${sql.lit(MAX_LIVES)})`,
        minutes_this_life: sql`minutes_this_life + ${v.minutes}`,
        minutes_total: sql`minutes_total + ${v.minutes}`,
        updated_at: v.now,
        status: ifBroken<CutterStatus>(sql.lit('retired'), 'status'),
        machine_id: ifBroken<number | null>(sql.raw('null'), 'machine_id'),
        retired_reason: ifBroken<'broken' | null>(sql.lit('broken'), 'retired_reason'),
        flagged: ifBroken<'broken' | null>(sql.lit('broken'), 'flagged'),
        flagged_at: ifBroken<Date | null>(v.now, 'flagged_at'),
      })
      .where('shop_id', '=', v.shopId).where('id', '=', v.id)
      // Still the life and status the figures were worked out for.
      .where('status', '=', v.status).where('regrind_count', '=', v.regrindCount).where('life_scale', '=', v.lifeScale)
      .returning(['life_used', 'minutes_total', 'minutes_this_life', 'status', 'machine_id', 'flagged', 'flagged_at', 'retired_reason']))
    // The log (its trigger keeps the roll-ups) and the events, only when the cutter row was updated.
    .with('log', (db) => db.insertInto('cut_logs').columns([
      'shop_id', 'cutter_id', 'machine_id', 'operator_id', 'material_id', 'minutes', 'wear_factor', 'life_added',
      'regrind_count', 'rpm', 'feed_mm_per_min', 'outcome', 'cleanup_minutes_per_part', 'note', 'idempotency_key', 'cut_at',
    ]).expression((eb) => eb.selectFrom('cutter').select([
      eb.val(v.shopId).as('shop_id'), eb.val(v.id).as('cutter_id'), eb.val(v.machineId).as('machine_id'), eb.val(v.operatorId).as('operator_id'),
      eb.val(v.materialId).as('material_id'), eb.val(v.minutes).as('minutes'), eb.val(v.wearFactor).as('wear_factor'),
      eb.val(v.added).as('life_added'), eb.val(v.regrindCount).as('regrind_count'), eb.val(v.rpm).as('rpm'),
      eb.val(v.feedMmPerMin).as('feed_mm_per_min'), eb.val(v.outcome).as('outcome'),
      eb.val(v.cleanupMinutesPerPart).as('cleanup_minutes_per_part'), eb.val(v.note).as('note'),
      eb.val(v.idempotencyKey).as('idempotency_key'), eb.val(v.cutAt).as('cut_at'),
    ])).returning(LOG_COLUMNS))
    .with('event', (db) => db.insertInto('cutter_events').columns(EVENT_COLUMNS).expression(sql`
      select ${sql.join(EVENT_COLUMNS.map((c) => sql.ref(`e.${c}`)))}
      from jsonb_populate_recordset(null::cutter_events, ${v.events}::jsonb) as e, cutter`).returning('id'))
    .selectFrom(['log', 'cutter'])
    .selectAll('log')
    .select(['cutter.life_used', 'cutter.minutes_total', 'cutter.minutes_this_life', 'cutter.status', 'cutter.machine_id as cutter_machine_id',
      'cutter.flagged', 'cutter.flagged_at', 'cutter.retired_reason'])
    .modifyEnd(PREPARED)
})

/** What came of one try: the log (new or sent before), or `stale` when the cutter changed meanwhile. */
type Attempt = { replay: boolean, log: CutLogRow, totals: { life_used: number, minutes_total: number, status: CutterStatus }, change?: CutterAfterCut } | 'stale'
type CutLogRow = Pick<Selectable<CutLogsTable>, typeof LOG_COLUMNS[number]>

/**
 * One try at logging: read the cutter without a lock, work out the life the cut used, then write
 * the log, the cutter's totals and the events in one statement, on condition that the cutter's
 * status and sharp life are still the ones read. One statement is one transaction on its own, and
 * no transaction stays open while the app works out what to write. If another change came between
 * the read and the write (a regrind, a retirement), nothing is written and the caller tries again.
 */
async function tryLogCut(db: Db, user: SessionUser, id: number, body: CutLogInput, cutAt: Date): Promise<Attempt> {
  const cutter = await readForLog(db, user.shopId, id, body)
  if (cutter.earlier_id != null) {
    const earlier = await db.selectFrom('cut_logs').select(LOG_COLUMNS)
      .where('shop_id', '=', user.shopId).where('id', '=', cutter.earlier_id).executeTakeFirstOrThrow()
    if (earlier.cutter_id !== id) throw createError({ statusCode: 409, statusMessage: KEY_USED })
    return { replay: true, log: earlier, totals: { life_used: cutter.life_used, minutes_total: cutter.minutes_total, status: cutter.status } }
  }
  if (cutter.material_id == null || cutter.wear_factor == null) badField('materialId', 'no such material in your shop')
  if (body.machineId != null && cutter.log_machine_name == null) badField('machineId', 'no such machine in your shop')
  await assertWasLoaded(db, user.shopId, id, cutter, cutAt, body.cutAt !== undefined)
  const machineId = body.machineId ?? cutter.machine_id

  const added = Math.min(MAX_LIVES, roundLife(lifeAdded(body.minutes, cutter.wear_factor, cutter.rated_life_minutes, cutter.life_scale)))
  // A break retires a cutter in a machine or back in the crib; one logged late for a bit since
  // sent for resharpening or marked lost leaves its status to the batch or the search.
  const broken = body.outcome === 'broken' && (cutter.status === 'in_spindle' || cutter.status === 'in_crib')
  const event = { shopId: user.shopId, cutterId: id, machineId, actorId: user.id }
  const events = [eventRow({ ...event, kind: 'cut_logged', from: cutter.status, to: cutter.status, note: `${body.minutes} min, ${body.outcome}` })]
  if (broken) {
    events.push(eventRow({ ...event, kind: 'flagged_broken', from: cutter.status, to: 'retired', note: body.note ?? 'Broke during a logged cut' }))
  }
  const { rows: [written] } = await writeLog(db, {
    shopId: user.shopId, id, status: cutter.status, regrindCount: cutter.regrind_count, lifeScale: cutter.life_scale,
    added, minutes: body.minutes, now: new Date(), broken,
    machineId, operatorId: user.id, materialId: cutter.material_id!, wearFactor: cutter.wear_factor!, rpm: body.rpm ?? null,
    feedMmPerMin: body.feedMmPerMin ?? null, outcome: body.outcome, cleanupMinutesPerPart: body.cleanupMinutesPerPart ?? null,
    note: body.note ?? '', idempotencyKey: body.idempotencyKey, cutAt,
    // As JSON text: pg would send an array as a PostgreSQL array.
    events: JSON.stringify(events),
  })
  if (!written) return 'stale'
  const { life_used, minutes_total, minutes_this_life, status, cutter_machine_id, flagged, flagged_at, retired_reason, ...log } = written
  // The state as read before the write, with the write's totals, and the new log as the page lists it.
  const change = {
    ...toCutterState({
      ...cutter, life_used, minutes_total, minutes_this_life, status, machine_id: cutter_machine_id, flagged, flagged_at, retired_reason,
      machine_name: cutter_machine_id === null ? null : cutter.machine_name,
      longest_cut_minutes: Math.max(cutter.longest_cut_minutes ?? 0, log.minutes),
    }),
    recentCuts: [toRecentCut({
      id: log.id, cut_at: log.cut_at, created_at: log.created_at, minutes: log.minutes, outcome: log.outcome, rpm: log.rpm,
      feed_mm_per_min: log.feed_mm_per_min, note: log.note, material_id: log.material_id, operator_id: user.id,
      material_name: cutter.material_name!, machine_name: body.machineId != null ? cutter.log_machine_name ?? null : cutter.machine_name, operator_name: user.name,
    })],
  }
  return { replay: false, log, totals: { life_used, minutes_total, status }, change }
}

async function writeCut(db: Db, user: SessionUser, id: number, body: CutLogInput, cutAt: Date) {
  for (let attempt = 0; attempt < 5; attempt++) {
    // Read again when the cutter changed since it was read, or when the same key was stored
    // meanwhile (a retry racing its first try, or two app instances: the unique index lets one
    // in). The next read finds that log and answers it, or 409 when it belongs to another cutter.
    const result = await tryLogCut(db, user, id, body, cutAt).catch((err: unknown) => {
      if (isUniqueViolation(err)) return 'stale' as const
      throw err
    })
    if (result !== 'stale') return result
  }
  throw createError({ statusCode: 409, statusMessage: 'The cutter kept changing while the cut was being logged. Send the log again.' })
}

/** The cutter view as a cut's answer carries it: without the remaining minutes, which the page works out. */
function changeOf({ remainingMinutes: _, ...change }: Awaited<ReturnType<typeof requireCutterView>>): CutterAfterCut {
  return change
}

/**
 * Logs a cut of one of the user's shop's cutters (404 when it is not the shop's) and answers the
 * log, the cutter's new totals and what changed in the cutter as the pages show it (its state and
 * the log among its recent ones: `withLoggedCut` puts it into the view); `replay` when the key was
 * sent before, in which case nothing is written again.
 */
export async function logCut(db: Db, user: SessionUser, cutterId: number, body: CutLogInput) {
  const cutAt = body.cutAt ? new Date(body.cutAt) : new Date()
  if (cutAt.getTime() > Date.now() + 5 * 60_000) badField('cutAt', 'is in the future; check the phone\'s clock')

  const result = await writeCut(db, user, cutterId, body, cutAt)
  const l = result.log
  return {
    replay: result.replay,
    log: {
      id: l.id, cutterId: l.cutter_id, machineId: l.machine_id, operatorId: l.operator_id, materialId: l.material_id,
      minutes: l.minutes, wearFactor: l.wear_factor, lifeAdded: l.life_added, rpm: l.rpm, feedMmPerMin: l.feed_mm_per_min,
      outcome: l.outcome, cleanupMinutesPerPart: l.cleanup_minutes_per_part, note: l.note, idempotencyKey: l.idempotency_key, cutAt: l.cut_at,
    },
    lifeUsed: result.totals.life_used,
    minutesTotal: result.totals.minutes_total,
    status: result.totals.status,
    // A new log answers the state its write produced with the log; a replay, the cutter as it is
    // now with its recent logs (the first answer may never have arrived).
    cutter: result.change ?? changeOf(await requireCutterView(db, user.shopId, { id: cutterId })),
  }
}
