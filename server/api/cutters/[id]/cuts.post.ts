// Log a cut (see logCut in server/utils/cut-log.ts): 201 with the new log, or 200 with the one
// sent before under the same idempotency key.
import { CutLogBody, CutterIdParams } from '#shared/schemas/spindle'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(CutterIdParams))
  const body = await readValidatedBody(event, parseWith(CutLogBody))
  const cutAt = body.cutAt ? new Date(body.cutAt) : new Date()
  if (cutAt.getTime() > Date.now() + 5 * 60_000) badField('cutAt', 'is in the future; check the phone\'s clock')

  const result = await logCut(user, id, body, cutAt)

  setResponseStatus(event, result.replay ? 200 : 201)
  const l = result.log
  return {
    replay: result.replay,
    log: {
      id: l.id, cutterId: l.cutter_id, machineId: l.machine_id, operatorId: l.operator_id, materialId: l.material_id,
      minutes: l.minutes, wearFactor: l.wear_factor, lifeAdded: l.life_added, rpm: l.rpm, feedMmPerMin: l.feed_mm_per_min,
      outcome: l.outcome, note: l.note, idempotencyKey: l.idempotency_key, cutAt: l.cut_at,
    },
    lifeUsed: result.totals.life_used,
    minutesTotal: result.totals.minutes_total,
    status: result.totals.status,
  }
})
