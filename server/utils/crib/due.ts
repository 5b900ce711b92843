// The cutters due for resharpening or retirement (DESIGN.md computation 2): one query for the
// home page and the crib's resharpening page, with the verdict from shared/kerf/due.ts.
import { dueAction, dueReason, retireCause, DUE_STATUSES, type DueReason } from '#shared/kerf/due'
import { expectedDiameterMm, retireSentence } from '#shared/kerf/regrind'
import type { Queryable } from '../../db/connect'

/** Batches a cutter can still be claimed by: drafts, and those out at the regrinder. */
export const OPEN_BATCH_STATUSES = ['draft', 'sent'] as const

export async function dueCutters(db: Queryable, shopId: number) {
  const shop = await db.selectFrom('shops').select(['life_threshold']).where('id', '=', shopId).executeTakeFirstOrThrow()
  const rows = await db.selectFrom('cutters as c')
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'c.machine_id').onRef('m.shop_id', '=', 'c.shop_id'))
    .select([
      'c.id', 'c.code', 'c.status', 'c.life_used', 'c.flagged', 'c.regrind_count', 'c.diameter_mm',
      't.id as typeId', 't.name as typeName', 't.max_regrinds', 't.regrind_diameter_loss_mm', 't.min_usable_diameter_mm',
      'm.name as machineName',
      // A draft already holding the cutter, so nobody batches it twice.
      (eb) => eb.selectFrom('regrind_batch_items as i')
        .innerJoin('regrind_batches as b', (j) => j.onRef('b.id', '=', 'i.batch_id').onRef('b.shop_id', '=', 'i.shop_id'))
        .select('b.id')
        .whereRef('i.cutter_id', '=', 'c.id').whereRef('i.shop_id', '=', 'c.shop_id')
        .where('b.status', 'in', [...OPEN_BATCH_STATUSES])
        .limit(1)
        .as('openBatchId'),
    ])
    .where('c.shop_id', '=', shopId)
    .where('c.status', 'in', [...DUE_STATUSES])
    .where((eb) => eb.or([eb('c.flagged', '=', 'dull'), eb('c.life_used', '>=', shop.life_threshold)]))
    .orderBy('c.life_used', 'desc').orderBy('c.code')
    .execute()

  const cutters = rows.flatMap((c) => {
    const cutter = { status: c.status, lifeUsed: c.life_used, flagged: c.flagged, regrindCount: c.regrind_count, diameterMm: c.diameter_mm }
    const type = { maxRegrinds: c.max_regrinds, regrindDiameterLossMm: c.regrind_diameter_loss_mm, minUsableDiameterMm: c.min_usable_diameter_mm }
    const reason: DueReason | null = dueReason(cutter, shop.life_threshold)
    if (!reason) return []
    const cause = retireCause(cutter, type)
    return [{
      id: c.id,
      code: c.code,
      typeId: c.typeId,
      typeName: c.typeName,
      status: c.status,
      machineName: c.machineName,
      lifeUsed: c.life_used,
      diameterMm: c.diameter_mm,
      regrindCount: c.regrind_count,
      maxRegrinds: c.max_regrinds,
      diameterAfterMm: expectedDiameterMm(c.diameter_mm, c.regrind_diameter_loss_mm),
      minUsableDiameterMm: c.min_usable_diameter_mm,
      reason,
      action: dueAction(cutter, type),
      retireReason: cause && retireSentence(cause, c.max_regrinds),
      openBatchId: c.openBatchId ?? null,
    }]
  })
  return { lifeThreshold: shop.life_threshold, cutters }
}
export type DueCutter = Awaited<ReturnType<typeof dueCutters>>['cutters'][number]
