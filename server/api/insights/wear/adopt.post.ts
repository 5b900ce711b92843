// Adopt learned wear factors: the chosen materials' factors become the fit's figures (over the
// same range the page showed), so life used counts with them from now on. Past cut logs keep
// the factor they were written with; each change is recorded with who and when. A figure whose
// 90 % interval is wide is only adopted when the body confirms it (409 otherwise, naming them).
import { resolveRange } from '#shared/kerf/date-range'
import { isWide } from '#shared/kerf/wear-model'
import { AdoptWearBody } from '#shared/schemas/insights'

// The materials table's own bounds (wear_factor > 0 and <= 100), at its three decimals.
const FLOOR = 0.01
const CEILING = 100

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readValidatedBody(event, parseWith(AdoptWearBody))
  const range = resolveRange(body)

  const adopted = await transaction(async (tx) => {
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
})
