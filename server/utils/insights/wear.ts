// Learned wear of a shop from every sharp life in the range (shared/kerf/wear-model.ts does the
// statistics, shared/kerf/wear-report.ts the words). Reads the cut_sharp_lives roll-up (a row a
// sharp life), never the raw cut logs, so it stays quick at millions of logs.
import { sql } from 'kysely'
import { fitWearModel, type SharpLife } from '#shared/kerf/wear-model'
import { describeWear } from '#shared/kerf/wear-report'
import type { DateRange } from '#shared/kerf/date-range'
import type { Queryable } from '../../db/connect'

export async function learnedWear(db: Queryable, shopId: number, range: DateRange) {
  const [materials, types, rows] = await Promise.all([
    // By id, so that the reference material (starting factor nearest 1, the first on a tie) is stable.
    db.selectFrom('materials').select(['id', 'name', 'wear_factor', 'active'])
      .where('shop_id', '=', shopId).orderBy('id').execute(),
    db.selectFrom('cutter_types').select(['id', 'name', 'rated_life_minutes']).where('shop_id', '=', shopId).execute(),
    // Every life whose last cut is in the range. It ended by wear when the cutter was reground
    // since (its count moved on), or it is the current life and the cutter went dull, is out for
    // resharpening or was retired worn out or undersize. Every other life is censored where it
    // stands: still cutting, broken, lost or retired for another reason.
    sql<{ material_minutes: Record<string, number>, rated_minutes: number | null, type_id: number, worn_out: boolean }>`
      select l.material_minutes, (l.minutes / nullif(l.sharp_share, 0))::float8 as rated_minutes, c.type_id,
        (c.regrind_count > l.regrind_count or (c.regrind_count = l.regrind_count and (
          c.flagged = 'dull' or c.status = 'at_regrind' or (c.status = 'retired' and c.retired_reason in ('worn', 'undersize'))))) as worn_out
      from cut_sharp_lives l
      join cutters c on c.id = l.cutter_id and c.shop_id = l.shop_id
      where l.shop_id = ${shopId} and l.last_cut_at >= ${range.start} and l.last_cut_at < ${range.end}`
      .execute(db).then((r) => r.rows),
  ])

  // Rated life × life scale as each log had it, recovered from life_added / wear factor: so a
  // later catalogue edit or a changed regrind fraction does not reshape old lives.
  const lives: SharpLife[] = []
  for (const r of rows) {
    if (r.rated_minutes && r.rated_minutes > 0) lives.push({ typeId: r.type_id, ratedLifeMinutes: r.rated_minutes, wornOut: r.worn_out, cuts: r.material_minutes })
  }
  const model = fitWearModel(lives, materials.map((m) => ({ materialId: m.id, startingFactor: m.wear_factor })))
  const report = describeWear(model, materials, types.map((t) => ({ id: t.id, name: t.name, ratedLifeMinutes: t.rated_life_minutes })))
  return {
    ...report,
    materials: report.materials.filter((m) => m.active || m.lives > 0).sort((a, b) => a.name.localeCompare(b.name)),
    types: report.types.sort((a, b) => a.name.localeCompare(b.name)),
  }
}
export type WearReport = Awaited<ReturnType<typeof learnedWear>>
export type WearRow = WearReport['materials'][number]
