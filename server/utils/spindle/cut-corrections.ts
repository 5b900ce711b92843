// Correcting or voiding a cut log, with a reason. In one transaction, under the log's and the
// cutter's row locks: the log's figures change (its trigger moves its share of the daily and
// sharp-life roll-ups), the cutter's totals move by the difference, and a change record and a
// history event say what changed, by whom and why. A log on a cutter reground since belongs to
// an earlier sharp life: only the minutes in all lives and that life's roll-up move, never the
// current life's figures. Totals never go below zero. A correction that changes nothing (sent
// twice) and a second void write nothing.
import { lifeAdded, roundLife } from '#shared/kerf/life'
import { OUTCOME_LABELS } from '#shared/kerf/history-words'
import { shopDay } from '#shared/kerf/dates'
import type { CutOutcome } from '#shared/kerf/spindle'
import { sql } from 'kysely'
import type { SessionUser } from '../platform/auth'

/** An operator may change their own logs for this long after logging them. */
export const OPERATOR_CORRECTION_HOURS = 24
// life_added and life_used are numeric(10,6); the cut route stops at the same limit.
const MAX_LIVES = 9999

export interface CutLogChange { minutes?: number, materialId?: number, outcome?: CutOutcome, note?: string }

export async function changeCutLog(user: SessionUser, logId: number, change: CutLogChange | 'void', reason: string) {
  const cutterId = await transaction(async (tx) => {
    const found = await tx.selectFrom('cut_logs').select(['cutter_id']).where('shop_id', '=', user.shopId).where('id', '=', String(logId)).executeTakeFirst()
    if (!found) notFound('cut log')
    // The cutter first, then the log: the order the other writers of a cutter's totals take.
    const cutter = await lockCutter(tx, user.shopId, found.cutter_id)
    const log = await tx.selectFrom('cut_logs as l')
      .innerJoin('materials as m', (j) => j.onRef('m.id', '=', 'l.material_id').onRef('m.shop_id', '=', 'l.shop_id'))
      .innerJoin('shops as s', 's.id', 'l.shop_id')
      .select(['s.time_zone', 'l.id', 'l.operator_id', 'l.created_at', 'l.cut_at', 'l.minutes', 'l.material_id', 'l.wear_factor', 'l.life_added',
        'l.regrind_count', 'l.outcome', 'l.note', 'l.voided_at', 'm.name as material_name'])
      .where('l.shop_id', '=', user.shopId).where('l.id', '=', String(logId))
      .forUpdate('l').executeTakeFirstOrThrow()

    if (user.role === 'operator') {
      const tooLate = Date.now() - log.created_at.getTime() > OPERATOR_CORRECTION_HOURS * 3_600_000
      if (log.operator_id !== user.id || tooLate) {
        throw createError({
          statusCode: 403,
          statusMessage: `You can correct your own cut logs within ${OPERATOR_CORRECTION_HOURS} hours of logging them. Ask a crib manager to change this one.`,
        })
      }
    }
    if (log.voided_at) {
      if (change === 'void') return cutter.id // voided already: a repeat is harmless
      throw createError({ statusCode: 409, statusMessage: 'This cut log was voided and cannot be corrected. Log the cut again if it happened.' })
    }

    let after = { minutes: log.minutes, materialId: log.material_id, materialName: log.material_name, wearFactor: log.wear_factor,
      lifeAdded: log.life_added, outcome: log.outcome, note: log.note }
    if (change !== 'void') {
      if (change.materialId !== undefined && change.materialId !== log.material_id) {
        const material = await tx.selectFrom('materials').select(['id', 'name', 'wear_factor'])
          .where('shop_id', '=', user.shopId).where('id', '=', change.materialId).where('active', '=', true).executeTakeFirst()
        if (!material) badFields({ materialId: 'no such material in your shop' })
        after = { ...after, materialId: material!.id, materialName: material!.name, wearFactor: material!.wear_factor }
      }
      after = { ...after, minutes: change.minutes ?? after.minutes, outcome: change.outcome ?? after.outcome, note: change.note ?? after.note }
      // The sharp life in force when the cut was logged (rated life x life scale) is the log's own
      // minutes x wear factor / life added; scaling keeps it without reading today's catalogue.
      const basis = log.life_added > 0 ? (log.minutes * log.wear_factor) / log.life_added : undefined
      after.lifeAdded = basis === undefined
        ? 0
        : Math.min(MAX_LIVES, roundLife(lifeAdded(after.minutes, after.wearFactor, basis)))
      const same = after.minutes === log.minutes && after.materialId === log.material_id && after.outcome === log.outcome && after.note === log.note
      if (same) return cutter.id // nothing to change: a correction sent twice writes nothing
    }

    const voiding = change === 'void'
    const minutesDelta = voiding ? -log.minutes : after.minutes - log.minutes
    const lifeDelta = voiding ? -log.life_added : after.lifeAdded - log.life_added
    const now = new Date()
    await tx.updateTable('cut_logs')
      .set(voiding
        ? { voided_at: now }
        : { minutes: after.minutes, material_id: after.materialId, wear_factor: after.wearFactor, life_added: after.lifeAdded, outcome: after.outcome, note: after.note })
      .where('shop_id', '=', user.shopId).where('id', '=', log.id).execute()

    const sameLife = log.regrind_count === cutter.regrind_count
    await tx.updateTable('cutters').set({
      minutes_total: sql`greatest(0, minutes_total + ${minutesDelta})`,
      ...(sameLife && {
        minutes_this_life: sql`greatest(0, minutes_this_life + ${minutesDelta})`,
        life_used: sql`least(${MAX_LIVES}, greatest(0, life_used + ${lifeDelta}))`,
      }),
      updated_at: now,
    }).where('shop_id', '=', user.shopId).where('id', '=', cutter.id).execute()

    const before = { minutes: log.minutes, materialId: log.material_id, materialName: log.material_name, wearFactor: log.wear_factor,
      lifeAdded: log.life_added, outcome: log.outcome, note: log.note }
    await tx.insertInto('cut_log_changes').values({
      shop_id: user.shopId, cut_log_id: log.id, cutter_id: cutter.id, kind: voiding ? 'voided' : 'corrected', actor_id: user.id, reason,
      before: JSON.stringify(before), after: JSON.stringify(voiding ? {} : after),
    }).execute()
    const what = `the cut of ${log.minutes} min in ${log.material_name} on ${shopDay(log.cut_at, log.time_zone)}`
    const changes = voiding ? [] : describeChanges(before, after)
    const life = sameLife ? '' : ` (a sharp life before regrind ${cutter.regrind_count}: only that life's figures change)`
    await recordEvent(tx, {
      shopId: user.shopId, cutterId: cutter.id, kind: voiding ? 'cut_voided' : 'cut_corrected', from: cutter.status, to: cutter.status,
      actorId: user.id, note: voiding ? `Voided ${what}${life}. Reason: ${reason}` : `Corrected ${what}: ${changes.join('; ')}${life}. Reason: ${reason}`,
    })
    return cutter.id
  })
  return requireCutterView(useDb(), user.shopId, { id: cutterId })
}

type Figures = { minutes: number, materialName: string, outcome: CutOutcome, note: string }

function describeChanges(before: Figures, after: Figures): string[] {
  const out: string[] = []
  if (before.minutes !== after.minutes) out.push(`minutes ${before.minutes} to ${after.minutes}`)
  if (before.materialName !== after.materialName) out.push(`material ${before.materialName} to ${after.materialName}`)
  if (before.outcome !== after.outcome) out.push(`outcome ${OUTCOME_LABELS[before.outcome]} to ${OUTCOME_LABELS[after.outcome]}`)
  if (before.note !== after.note) out.push('note changed')
  return out
}
