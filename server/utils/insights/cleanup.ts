// Outcomes and cleanup minutes by cutter type × material over a range of days, from the two
// roll-ups (cut_log_daily and cut_cleanup_daily, never the raw logs), with the cleanup priced at
// the shop's labour rate: "the two-flute costs ten minutes of cleanup a part in HDPE", in money.
import { sql } from 'kysely'
import { cleanupCentsPerPart, rate } from '#shared/kerf/cost'
import type { DateRange } from '#shared/kerf/date-range'
import type { Queryable } from '../../db/connect'

export async function cleanupByTypeAndMaterial(db: Queryable, shopId: number, range: DateRange) {
  const [outcomes, cleanup, types, materials, shop] = await Promise.all([
    db.selectFrom('cut_log_daily')
      .select([
        'type_id', 'material_id', sql<number>`sum(logs)`.as('logs'), sql<number>`sum(clean)`.as('clean'),
        sql<number>`sum(melted)`.as('melted'), sql<number>`sum(fuzzy)`.as('fuzzy'), sql<number>`sum(chip_out)`.as('chip_out'),
        sql<number>`sum(broken)`.as('broken'),
      ])
      .where('shop_id', '=', shopId).where('day', '>=', range.from).where('day', '<=', range.to)
      .groupBy(['type_id', 'material_id']).execute(),
    db.selectFrom('cut_cleanup_daily')
      .select(['type_id', 'material_id', sql<number>`sum(logs)`.as('logs'), sql<number>`sum(minutes)`.as('minutes')])
      .where('shop_id', '=', shopId).where('day', '>=', range.from).where('day', '<=', range.to)
      .groupBy(['type_id', 'material_id']).execute(),
    db.selectFrom('cutter_types').select(['id', 'name']).where('shop_id', '=', shopId).execute(),
    db.selectFrom('materials').select(['id', 'name']).where('shop_id', '=', shopId).execute(),
    db.selectFrom('shops').select('labour_rate_cents_per_hour').where('id', '=', shopId).executeTakeFirstOrThrow(),
  ])
  const typeName = new Map(types.map((t) => [t.id, t.name]))
  const materialName = new Map(materials.map((m) => [m.id, m.name]))
  const cleanupBy = new Map(cleanup.map((c) => [`${c.type_id}:${c.material_id}`, c]))
  const labour = shop.labour_rate_cents_per_hour

  const rows = outcomes.map((o) => {
    const c = cleanupBy.get(`${o.type_id}:${o.material_id}`)
    const logs = Number(o.logs)
    const cleanupLogs = Number(c?.logs ?? 0)
    const minutesPerPart = cleanupLogs ? Math.round((Number(c!.minutes) / cleanupLogs) * 10) / 10 : null
    return {
      typeId: o.type_id,
      typeName: typeName.get(o.type_id) ?? 'Unknown type',
      materialId: o.material_id,
      materialName: materialName.get(o.material_id) ?? 'Unknown material',
      logs,
      clean: Number(o.clean),
      melted: Number(o.melted),
      fuzzy: Number(o.fuzzy),
      chipOut: Number(o.chip_out),
      broken: Number(o.broken),
      cleanShare: rate(Number(o.clean), logs),
      cleanupLogs,
      cleanupMinutesPerPart: minutesPerPart,
      cleanupCentsPerPart: cleanupCentsPerPart(minutesPerPart, labour),
    }
  })
  // Dearest cleanup first, then the most troubled pairs, then by name.
  rows.sort((a, b) => (b.cleanupMinutesPerPart ?? -1) - (a.cleanupMinutesPerPart ?? -1)
    || (a.cleanShare ?? 1) - (b.cleanShare ?? 1) || a.typeName.localeCompare(b.typeName) || a.materialName.localeCompare(b.materialName))
  return { labourRateCentsPerHour: labour, rows }
}
