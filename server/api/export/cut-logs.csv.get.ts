// The shop's cut logs between two of its days (both included, midnight to midnight in its time
// zone) as CSV; the last 30 days by default. Times are written in the shop's own time zone
// (named in a column), outcomes in words.
import { CutLogExportQuery } from '#shared/schemas/crib'
import { OUTCOME_LABELS } from '#shared/kerf/history-words'
import { localClock } from '#shared/kerf/report-schedule'
import { addDays, dayRange } from '#shared/kerf/date-range'
import { shopDay } from '#shared/kerf/dates'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const query = await getValidatedQuery(event, parseWith(CutLogExportQuery))
  const timeZone = await shopTimeZone(useDb(), user.shopId)
  const to = query.to ?? shopDay(new Date(), timeZone)
  const { from, start, end } = dayRange(query.from ?? addDays(to, -29), to, timeZone)
  const rows = await useDb().selectFrom('cut_logs as l')
    .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'l.cutter_id').onRef('c.shop_id', '=', 'l.shop_id'))
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .innerJoin('materials as mt', (j) => j.onRef('mt.id', '=', 'l.material_id').onRef('mt.shop_id', '=', 'l.shop_id'))
    .leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'l.machine_id').onRef('m.shop_id', '=', 'l.shop_id'))
    .leftJoin('users as u', (j) => j.onRef('u.id', '=', 'l.operator_id').onRef('u.shop_id', '=', 'l.shop_id'))
    .select(['l.cut_at', 'c.code', 't.name as type', 'm.name as machine', 'u.name as operator', 'mt.name as material',
      'l.minutes', 'l.outcome', 'l.rpm', 'l.feed_mm_per_min', 'l.note'])
    .where('l.shop_id', '=', user.shopId).where('l.voided_at', 'is', null)
    .where('l.cut_at', '>=', start)
    .where('l.cut_at', '<', end)
    .orderBy('l.cut_at').orderBy('l.id')
    .execute()
  return sendCsv(event, `cut-logs-${from}-to-${to}.csv`,
    ['date', 'time', 'time_zone', 'cutter_code', 'type', 'machine', 'operator', 'material', 'minutes', 'outcome', 'rpm', 'feed_mm_per_min', 'note'],
    rows.map((r) => {
      const local = localClock(r.cut_at, timeZone)
      return [local.date, local.time, timeZone, r.code, r.type, r.machine ?? '', r.operator ?? '', r.material, r.minutes,
        OUTCOME_LABELS[r.outcome], r.rpm ?? '', r.feed_mm_per_min ?? '', r.note]
    }))
})
