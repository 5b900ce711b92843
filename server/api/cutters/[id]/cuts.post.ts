// Log a cut. The log, the cutter's life and minute totals, and the event are written in one
// transaction under the cutter's row lock; the client's idempotency key makes a retry (after a
// dropped connection, or from the phone's queue) return the first log instead of counting twice.
import { sql } from 'kysely'
import { lifeAdded, roundLife } from '#shared/kerf/life'
import { CutLogBody, CutterIdParams } from '#shared/schemas/spindle'
import type { Tx } from '../../../db/connect'

const LOG_COLUMNS = ['id', 'cutter_id', 'machine_id', 'operator_id', 'material_id', 'minutes', 'wear_factor', 'life_added',
  'rpm', 'feed_mm_per_min', 'outcome', 'note', 'idempotency_key', 'cut_at'] as const

const MAX_LIVES = 9999

function badField(field: string, message: string): never {
  throw createError({ statusCode: 400, statusMessage: `${field}: ${message}`, data: { fields: { [field]: message } } })
}

async function findByKey(tx: Tx, shopId: number, key: string) {
  return tx.selectFrom('cut_logs').select(LOG_COLUMNS).where('shop_id', '=', shopId).where('idempotency_key', '=', key).executeTakeFirst()
}

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const body = await readValidatedBody(event, parseWith(CutLogBody))
  const cutAt = body.cutAt ? new Date(body.cutAt) : new Date()
  if (cutAt.getTime() > Date.now() + 5 * 60_000) badField('cutAt', 'is in the future; check the phone\'s clock')

  const result = await transaction(async (tx) => {
    const cutter = await lockCutter(tx, user.shopId, id)
    const earlier = await findByKey(tx, user.shopId, body.idempotencyKey)
    if (earlier) {
      if (earlier.cutter_id !== id) {
        throw createError({ statusCode: 409, statusMessage: 'This idempotency key was already used for another cutter. Send the log with a new key.' })
      }
      return { replay: true, log: earlier }
    }

    const material = await tx.selectFrom('materials').select(['id', 'wear_factor'])
      .where('shop_id', '=', user.shopId).where('id', '=', body.materialId).where('active', '=', true)
      .executeTakeFirst()
    if (!material) badField('materialId', 'no such material in your shop')
    const machineId = body.machineId ?? cutter.machine_id
    if (body.machineId) {
      const machine = await tx.selectFrom('machines').select('id')
        .where('shop_id', '=', user.shopId).where('id', '=', body.machineId).executeTakeFirst()
      if (!machine) badField('machineId', 'no such machine in your shop')
    }

    // life_added and life_used are numeric(10,6), at most 9999.999999 lives. Only a rated life
    // entered far too short gets near that; the figures stop at the column's limit instead of
    // failing the log (the cutter is long due by then).
    const added = Math.min(MAX_LIVES, roundLife(lifeAdded(body.minutes, material.wear_factor, cutter.rated_life_minutes, cutter.life_scale)))
    const log = await tx.insertInto('cut_logs').values({
      shop_id: user.shopId,
      cutter_id: id,
      machine_id: machineId,
      operator_id: user.id,
      material_id: material.id,
      minutes: body.minutes,
      wear_factor: material.wear_factor,
      life_added: added,
      regrind_count: cutter.regrind_count,
      rpm: body.rpm ?? null,
      feed_mm_per_min: body.feedMmPerMin ?? null,
      outcome: body.outcome,
      note: body.note ?? '',
      idempotency_key: body.idempotencyKey,
      cut_at: cutAt,
    }).returning(LOG_COLUMNS).executeTakeFirstOrThrow()

    const broken = body.outcome === 'broken' && cutter.status !== 'retired'
    await tx.updateTable('cutters')
      .set({
        life_used: sql`least(life_used + ${added}, ${MAX_LIVES})`,
        minutes_this_life: sql`minutes_this_life + ${body.minutes}`,
        minutes_total: sql`minutes_total + ${body.minutes}`,
        updated_at: new Date(),
        ...(broken && { status: 'retired', machine_id: null, retired_reason: 'broken', flagged: 'broken', flagged_at: new Date() }),
      })
      .where('shop_id', '=', user.shopId).where('id', '=', id)
      .execute()
    await recordEvent(tx, {
      shopId: user.shopId, cutterId: id, kind: 'cut_logged', from: cutter.status, to: cutter.status, machineId, actorId: user.id,
      note: `${body.minutes} min, ${body.outcome}`,
    })
    if (broken) {
      await recordEvent(tx, {
        shopId: user.shopId, cutterId: id, kind: 'flagged_broken', from: cutter.status, to: 'retired', machineId, actorId: user.id,
        note: body.note ?? 'Broke during a logged cut',
      })
    }
    return { replay: false, log }
  }).catch((err: { code?: string }) => {
    // The same key sent at once for two different cutters: the unique index decides.
    if (err.code === '23505') {
      throw createError({ statusCode: 409, statusMessage: 'This idempotency key was already used for another cutter. Send the log with a new key.' })
    }
    throw err
  })

  const totals = await useDb().selectFrom('cutters').select(['life_used', 'minutes_total', 'status'])
    .where('shop_id', '=', user.shopId).where('id', '=', id).executeTakeFirstOrThrow()
  setResponseStatus(event, result.replay ? 200 : 201)
  const l = result.log
  return {
    replay: result.replay,
    log: {
      id: l.id, cutterId: l.cutter_id, machineId: l.machine_id, operatorId: l.operator_id, materialId: l.material_id,
      minutes: l.minutes, wearFactor: l.wear_factor, lifeAdded: l.life_added, rpm: l.rpm, feedMmPerMin: l.feed_mm_per_min,
      outcome: l.outcome, note: l.note, idempotencyKey: l.idempotency_key, cutAt: l.cut_at,
    },
    lifeUsed: totals.life_used,
    minutesTotal: totals.minutes_total,
    status: totals.status,
  }
})
