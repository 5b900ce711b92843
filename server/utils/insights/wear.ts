// Learned wear factors of a shop from its finished lives (shared/kerf/wear-fit.ts does the
// arithmetic). Reads the cut_sharp_lives roll-up (a row a sharp life), never the raw cut logs,
// so it stays quick at millions of logs.
import { sql } from 'kysely'
import { fitWear, type FinishedLife } from '#shared/kerf/wear-fit'
import { resolveRange, type DateRange } from '#shared/kerf/date-range'
import type { AdoptWearBody } from '#shared/schemas/insights'
import type { z } from 'zod'
import type { Db, Queryable } from '../../db/connect'
import { notFound, type SessionUser } from '../platform/auth'

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

// The materials table's own bounds (wear_factor > 0 and <= 100), at its three decimals.
const FLOOR = 0.01
const CEILING = 100

/**
 * Adopts learned wear factors: the chosen materials' factors become the fit's figures (over the
 * same range the page showed), so life used counts with them from now on. Past cut logs keep
 * the factor they were written with; each change is recorded with who and when.
 */
export async function adoptWearFactors(db: Db, user: SessionUser, body: z.output<typeof AdoptWearBody>) {
  const range = resolveRange(body)
  const adopted = await db.transaction().execute(async (tx) => {
    // Lock the shop's materials so two adoptions cannot cross.
    await tx.selectFrom('materials').select('id').where('shop_id', '=', user.shopId).forUpdate().execute()
    const fit = new Map((await learnedWear(tx, user.shopId, range)).map((m) => [m.materialId, m]))
    const missing = body.materialIds.filter((id) => !fit.has(id))
    if (missing.length) notFound('material')
    const changes = [...new Set(body.materialIds)].map((id) => fit.get(id)!)
      .filter((m) => m.lives > 0)
      .map((m) => ({ ...m, to: Math.min(CEILING, Math.max(FLOOR, Math.round(m.learnedFactor * 1000) / 1000)) }))
      .filter((m) => m.to !== m.startingFactor)
    for (const m of changes) {
      await tx.updateTable('materials').set({ wear_factor: m.to })
        .where('shop_id', '=', user.shopId).where('id', '=', m.materialId).execute()
    }
    if (changes.length) {
      await tx.insertInto('wear_factor_adoptions').values(changes.map((m) => ({
        shop_id: user.shopId, material_id: m.materialId, from_factor: m.startingFactor, to_factor: m.to, lives: m.lives,
        from_date: range.from, to_date: range.to, adopted_by: user.id,
      }))).execute()
    }
    return changes.map((m) => ({ materialId: m.materialId, name: m.name, from: m.startingFactor, to: m.to, lives: m.lives }))
  })
  const skipped = body.materialIds.length - adopted.length
  return {
    adopted,
    message: adopted.length
      ? `New wear factors for ${adopted.map((a) => a.name).join(', ')} count from now on.${skipped ? ` ${skipped} left as they were: no finished life backs them, or nothing changed.` : ''}`
      : 'Nothing changed: no finished life backs those materials, or their factors already match.',
  }
}
