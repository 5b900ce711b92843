// The shop's cut logs between two UTC dates (both included) as CSV; the last 30 days by default.
// Times are written in the shop's own time zone (named in a column), outcomes in words.
import { addHours, parseISO, subHours } from 'date-fns'
import { CutLogExportQuery } from '#shared/schemas/crib'
import { OUTCOME_LABELS } from '#shared/kerf/history-words'
import { localClock } from '#shared/kerf/report-schedule'

// Whole UTC days as hours: date-fns' addDays follows the server's local clock across daylight saving.
const DAY_HOURS = 24

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const query = await getValidatedQuery(event, parseWith(CutLogExportQuery))
  const to = query.to ?? new Date().toISOString().slice(0, 10)
  const toStart = parseISO(`${to}T00:00:00Z`)
  const from = query.from ?? subHours(toStart, 29 * DAY_HOURS).toISOString().slice(0, 10)
  const shop = await useDb().selectFrom('shops').select('time_zone').where('id', '=', user.shopId).executeTakeFirstOrThrow()
  const rows = await useDb().selectFrom('cut_logs as l')
    .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'l.cutter_id').onRef('c.shop_id', '=', 'l.shop_id'))
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .innerJoin('materials as mt', (j) => j.onRef('mt.id', '=', 'l.material_id').onRef('mt.shop_id', '=', 'l.shop_id'))
    .leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'l.machine_id').onRef('m.shop_id', '=', 'l.shop_id'))
    .leftJoin('users as u', (j) => j.onRef('u.id', '=', 'l.operator_id').onRef('u.shop_id', '=', 'l.shop_id'))
    .select(['l.cut_at', 'c.code', 't.name as type', 'm.name as machine', 'u.name as operator', 'mt.name as material',
      'l.minutes', 'l.outcome', 'l.rpm', 'l.feed_mm_per_min', 'l.note'])
    .where('l.shop_id', '=', user.shopId).where('l.voided_at', 'is', null)
    .where('l.cut_at', '>=', parseISO(`${from}T00:00:00Z`))
    .where('l.cut_at', '<', addHours(toStart, DAY_HOURS))
    .orderBy('l.cut_at').orderBy('l.id')
    .execute()
  return sendCsv(event, `cut-logs-${from}-to-${to}.csv`,
    ['date', 'time', 'time_zone', 'cutter_code', 'type', 'machine', 'operator', 'material', 'minutes', 'outcome', 'rpm', 'feed_mm_per_min', 'note'],
    rows.map((r) => {
      const local = localClock(r.cut_at, shop.time_zone)
      return [local.date, local.time, shop.time_zone, r.code, r.type, r.machine ?? '', r.operator ?? '', r.material, r.minutes,
        OUTCOME_LABELS[r.outcome], r.rpm ?? '', r.feed_mm_per_min ?? '', r.note]
    }))
})
