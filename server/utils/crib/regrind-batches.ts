// What the resharpening routes share: locking a batch of the shop, and claiming cutters for a
// draft under their row locks so that no cutter ever sits in two open batches.
import { dueReason, retireCause, DUE_STATUSES } from '#shared/kerf/due'
import { retireSentence, type BatchStatus } from '#shared/kerf/regrind'
import type { Tx } from '../../db/connect'

/** The batch's row, locked until the transaction ends; 404 when it is not in the shop. */
export async function lockRegrindBatch(tx: Tx, shopId: number, id: number) {
  const row = await tx.selectFrom('regrind_batches')
    .select(['id', 'number', 'status', 'supplier_id', 'note', 'sent_at', 'received_at'])
    .where('shop_id', '=', shopId).where('id', '=', id)
    .forUpdate()
    .executeTakeFirst()
  if (!row) notFound('resharpening batch')
  return row
}

const BATCH_SENTENCE: Record<BatchStatus, string> = {
  draft: 'is still a draft',
  sent: 'is out at the regrinder',
  received: 'was already received back',
  cancelled: 'was cancelled',
}

/** 409 unless the batch is in the status the action needs. */
export function requireBatchStatus(batch: { number: number, status: BatchStatus }, wanted: BatchStatus, action: string): void {
  if (batch.status === wanted) return
  const hint = batch.status === 'draft' ? ' Send it first.' : batch.status === 'sent' ? ' Receive it back instead.' : ''
  throw createError({
    statusCode: 409,
    statusMessage: `Batch ${batch.number} ${BATCH_SENTENCE[batch.status]}, so it cannot be ${action}.${hint}`,
    data: { status: batch.status },
  })
}

export interface BatchWarning { cutterId: number, code: string, message: string }

/**
 * Locks the cutters (in id order, so two requests never deadlock) and checks that each may go
 * into the draft `ownBatchId` (or a new one): in the crib or a machine, and in no other open
 * batch. Cutters that are not due, or due to be retired, are allowed with a warning.
 */
export async function claimCuttersForBatch(tx: Tx, shopId: number, ids: readonly number[], ownBatchId: number | null) {
  if (!ids.length) return { cutters: [], warnings: [] as BatchWarning[] }
  const shop = await tx.selectFrom('shops').select('life_threshold').where('id', '=', shopId).executeTakeFirstOrThrow()
  const cutters = await tx.selectFrom('cutters as c')
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .select(['c.id', 'c.code', 'c.status', 'c.diameter_mm', 'c.life_used', 'c.flagged', 'c.regrind_count',
      't.max_regrinds', 't.regrind_diameter_loss_mm', 't.min_usable_diameter_mm'])
    .where('c.shop_id', '=', shopId).where('c.id', 'in', [...ids])
    .orderBy('c.id')
    .forUpdate('c')
    .execute()
  if (cutters.length !== ids.length) notFound('cutter')

  const unfit = cutters.filter((c) => !(DUE_STATUSES as readonly string[]).includes(c.status))
  if (unfit.length) {
    throw createError({
      statusCode: 409,
      statusMessage: `Only cutters in the crib or a machine can go for resharpening: ${unfit.map((c) => `${c.code} ${STATUS_SENTENCE[c.status]}`).join('; ')}.`,
      data: { cutterIds: unfit.map((c) => c.id) },
    })
  }

  let taken = tx.selectFrom('regrind_batch_items as i')
    .innerJoin('regrind_batches as b', (j) => j.onRef('b.id', '=', 'i.batch_id').onRef('b.shop_id', '=', 'i.shop_id'))
    .select(['i.cutter_id', 'b.number as batchNumber'])
    .where('i.shop_id', '=', shopId).where('i.cutter_id', 'in', [...ids])
    .where('b.status', 'in', [...OPEN_BATCH_STATUSES])
  if (ownBatchId !== null) taken = taken.where('b.id', '<>', ownBatchId)
  const clashes = await taken.execute()
  if (clashes.length) {
    const code = (id: number) => cutters.find((c) => c.id === id)!.code
    throw createError({
      statusCode: 409,
      statusMessage: `Already in another open batch: ${clashes.map((x) => `${code(x.cutter_id)} (batch ${x.batchNumber})`).join(', ')}. Remove them there first.`,
      data: { cutterIds: clashes.map((x) => x.cutter_id) },
    })
  }

  const warnings: BatchWarning[] = []
  for (const c of cutters) {
    const cutter = { status: c.status, lifeUsed: c.life_used, flagged: c.flagged, regrindCount: c.regrind_count, diameterMm: c.diameter_mm }
    const cause = retireCause(cutter, {
      maxRegrinds: c.max_regrinds, regrindDiameterLossMm: c.regrind_diameter_loss_mm, minUsableDiameterMm: c.min_usable_diameter_mm,
    })
    if (!dueReason(cutter, shop.life_threshold)) {
      warnings.push({ cutterId: c.id, code: c.code, message: `${c.code} is not due yet: ${Math.round(c.life_used * 100)} % of its life used.` })
    } else if (cause) {
      warnings.push({ cutterId: c.id, code: c.code, message: `${c.code} is due to be retired rather than resharpened. ${retireSentence(cause, c.max_regrinds)}` })
    }
  }
  return { cutters, warnings }
}

/** Adds claimed cutters to a draft, with the diameter they leave at. */
export async function addBatchItems(tx: Tx, shopId: number, batchId: number, cutters: ReadonlyArray<{ id: number, diameter_mm: number }>) {
  if (!cutters.length) return
  await tx.insertInto('regrind_batch_items')
    .values(cutters.map((c) => ({ shop_id: shopId, batch_id: batchId, cutter_id: c.id, diameter_before_mm: c.diameter_mm })))
    .onConflict((oc) => oc.columns(['batch_id', 'cutter_id']).doNothing())
    .execute()
}
