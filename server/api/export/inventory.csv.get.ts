// Every cutter of the shop as CSV: label code, type, status, machine, diameter, regrinds, life
// used and minutes cut; statuses in words.
import { STATUS_LABELS } from '#shared/kerf/status'
import { shopDay } from '#shared/kerf/dates'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const rows = await useDb().selectFrom('cutters as c')
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'c.machine_id').onRef('m.shop_id', '=', 'c.shop_id'))
    .select(['c.code', 't.name as type', 'c.status', 'm.name as machine', 'c.diameter_mm', 'c.regrind_count', 'c.life_used', 'c.minutes_total'])
    .where('c.shop_id', '=', user.shopId)
    .orderBy('t.name').orderBy('c.code')
    .execute()
  const day = shopDay(new Date(), await shopTimeZone(useDb(), user.shopId))
  return sendCsv(event, `inventory-${day}.csv`,
    ['code', 'type', 'status', 'machine', 'diameter_mm', 'regrind_count', 'life_used_percent', 'minutes_total'],
    rows.map((r) => [r.code, r.type, STATUS_LABELS[r.status], r.machine ?? '', r.diameter_mm, r.regrind_count, Math.round(r.life_used * 1000) / 10, r.minutes_total]))
})
