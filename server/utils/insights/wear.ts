// Learned wear of a shop from every sharp life in the range (shared/kerf/wear-model.ts does the
// statistics, shared/kerf/wear-report.ts the words). Reads the cut_sharp_lives roll-up (a row a
// sharp life), never the raw cut logs, so it stays quick at millions of logs.
import { sql } from 'kysely'
import { fitWearModel, isWide, type SharpLife } from '#shared/kerf/wear-model'
import { describeWear } from '#shared/kerf/wear-report'
import { resolveRange, type DateRange } from '#shared/kerf/date-range'
import type { AdoptWearBody } from '#shared/schemas/insights'
import type { z } from 'zod'
import type { Db, Queryable } from '../../db/connect'
import { notFound, type SessionUser } from '../platform/auth'
import { shopTimeZone } from '../platform/shop-settings'

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

// The materials table's own bounds (wear_factor > 0 and <= 100), at its three decimals.
const FLOOR = 0.01
const CEILING = 100

/**
 * Adopts learned wear factors: the chosen materials' factors become the fit's figures (over the
 * same range the page showed), so life used counts with them from now on. Past cut logs keep
 * the factor they were written with; each change is recorded with who and when.
 */
export async function adoptWearFactors(db: Db, user: SessionUser, body: z.output<typeof AdoptWearBody>) {
  const range = resolveRange(body, await shopTimeZone(db, user.shopId))
  const adopted = await db.transaction().execute(async (tx) => {
    // Lock the shop's materials so two adoptions cannot cross.
    await tx.selectFrom('materials').select('id').where('shop_id', '=', user.shopId).forUpdate().execute()
    const fit = new Map((await learnedWear(tx, user.shopId, range)).materials.map((m) => [m.materialId, m]))
    const missing = body.materialIds.filter((id) => !fit.has(id))
    if (missing.length) notFound('material')
    const changes = [...new Set(body.materialIds)].map((id) => fit.get(id)!)
      .filter((m) => m.lives > 0)
      .map((m) => ({ ...m, to: Math.min(CEILING, Math.max(FLOOR, Math.round(m.learnedFactor * 1000) / 1000)) }))
      .filter((m) => m.to !== m.startingFactor)
    const wide = changes.filter((m) => isWide(m.interval))
    if (wide.length && !body.confirmWide) {
      throw createError({
        statusCode: 409,
        statusMessage: `The learned ${wide.length === 1 ? 'factor' : 'factors'} for ${wide.map((m) => `${m.name} (${m.interval ? `${m.interval[0]} to ${m.interval[1]}` : 'no interval'})`).join(', ')} ${wide.length === 1 ? 'is' : 'are'} uncertain: confirm to adopt anyway.`,
        data: { wide: wide.map((m) => ({ materialId: m.materialId, name: m.name, interval: m.interval })) },
      })
    }
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
      ? `New wear factors for ${adopted.map((a) => a.name).join(', ')} count from now on.${skipped ? ` ${skipped} left as they were: no life backs them, or nothing changed.` : ''}`
      : 'Nothing changed: no life backs those materials, or their factors already match (the reference material never changes).',
  }
}
