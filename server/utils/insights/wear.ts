// Learned wear of a shop from every sharp life in the range (shared/kerf/wear-model.ts does the
// statistics, shared/kerf/wear-report.ts the words). Reads the cut_sharp_lives roll-up (a row a
// sharp life), never the raw cut logs, so it stays quick at millions of logs.
import { fitWearModel, isWide } from '#shared/kerf/wear-model'
import { describeWear } from '#shared/kerf/wear-report'
import { resolveRange, type DateRange } from '#shared/kerf/date-range'
import type { AdoptWearBody } from '#shared/schemas/insights'
import type { z } from 'zod'
import type { Db, Queryable } from '../../db/connect'
import { notFound, type SessionUser } from '../platform/auth'
import { shopTimeZone } from '../platform/shop-settings'
import { readSharpLives } from './sharp-lives'

export async function learnedWear(db: Queryable, shopId: number, range: DateRange) {
  const [materials, types, lives] = await Promise.all([
    // By id, so that the reference material (starting factor nearest 1, the first on a tie) is stable.
    db.selectFrom('materials').select(['id', 'name', 'wear_factor', 'active'])
      .where('shop_id', '=', shopId).orderBy('id').execute(),
    db.selectFrom('cutter_types').select(['id', 'name', 'rated_life_minutes']).where('shop_id', '=', shopId).execute(),
    readSharpLives(db, shopId, range),
  ])

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
