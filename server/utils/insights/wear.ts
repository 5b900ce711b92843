// Learned wear factors of a shop from its finished lives (shared/kerf/wear-fit.ts does the
// arithmetic). Reads the cut_sharp_lives roll-up (a row a sharp life), never the raw cut logs,
// so it stays quick at millions of logs.
import { sql } from 'kysely'
import { fitWear, type FinishedLife } from '#shared/kerf/wear-fit'
import type { DateRange } from '#shared/kerf/date-range'
import type { Queryable } from '../../db/connect'

export async function learnedWear(db: Queryable, shopId: number, range: DateRange) {
  const [materials, rows] = await Promise.all([
    db.selectFrom('materials').select(['id', 'name', 'wear_factor', 'active'])
      .where('shop_id', '=', shopId).orderBy('name').execute(),
    // A life is finished when the cutter was reground since (its count moved on), or it is the
    // current life and the cutter went dull, is out for resharpening or was retired worn out.
    // Broken and lost cutters say nothing about wear. Lives count in the range they ended in.
    sql<{ material_minutes: Record<string, number>, sharp_minutes: number | null }>`
      select l.material_minutes, (l.minutes / nullif(l.sharp_share, 0))::float8 as sharp_minutes
      from cut_sharp_lives l
      join cutters c on c.id = l.cutter_id and c.shop_id = l.shop_id
      where l.shop_id = ${shopId} and l.last_cut_at >= ${range.start} and l.last_cut_at < ${range.end}
        and (c.regrind_count > l.regrind_count or (c.regrind_count = l.regrind_count and (
          c.flagged = 'dull' or c.status = 'at_regrind' or (c.status = 'retired' and c.retired_reason in ('worn', 'undersize')))))`
      .execute(db).then((r) => r.rows),
  ])

  // Rated life × life scale as each log had it, recovered from life_added / wear factor: so a
  // later catalogue edit or a changed regrind fraction does not reshape old lives.
  const finished: FinishedLife[] = rows.filter((r) => r.sharp_minutes && r.sharp_minutes > 0).map((r) => ({
    ratedLifeMinutes: r.sharp_minutes!,
    lifeScale: 1,
    cuts: Object.entries(r.material_minutes).map(([materialId, minutes]) => ({ materialId: Number(materialId), minutes })),
  }))

  const fit = fitWear(finished, materials.map((m) => ({ materialId: m.id, startingFactor: m.wear_factor })))
  return fit.map((f, i) => ({
    materialId: f.materialId,
    name: materials[i]!.name,
    active: materials[i]!.active,
    startingFactor: f.startingFactor,
    learnedFactor: Math.round(f.learnedFactor * 1000) / 1000,
    lives: f.lives,
    minutes: Math.round(f.minutes * 100) / 100,
    confidence: f.confidence,
  })).filter((m) => m.active || m.lives > 0)
}
export type WearRow = Awaited<ReturnType<typeof learnedWear>>[number]
