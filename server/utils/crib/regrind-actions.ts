// Sending a resharpening batch to the regrinder and receiving it back: the two writes that move a
// batch along, each one transaction under the batch's and its cutters' row locks.
import { DUE_STATUSES } from '#shared/kerf/due'
import { afterRegrind, RETIRED_REASON, receiptVerdict, roundMm } from '#shared/kerf/regrind'
import type { ReceiveBatchBody } from '#shared/schemas/regrind'
import type { z } from 'zod'
import type { Db, Tx } from '../../db/connect'
import type { SessionUser } from '../platform/auth'
import { badField } from '../platform/validation'
import { recordEvent, STATUS_SENTENCE } from '../spindle/spindle'
import { lockRegrindBatch, requireBatchStatus } from './regrind-batches'
import { mailBatchToSupplier } from './regrind-mail'
import { requireRegrindBatchView } from './regrind-view'

/**
 * Sends a draft to the regrinder: every cutter leaves its machine or the crib and is out for
 * resharpening, with an event each. A cutter that changed since the draft (retired, lost, ...)
 * stops the send with a 409 naming it. The list is e-mailed to the supplier afterwards when asked.
 */
export async function sendRegrindBatch(db: Db, user: SessionUser, id: number, emailSupplier?: boolean) {
  await db.transaction().execute(async (tx) => {
    const batch = await lockRegrindBatch(tx, user.shopId, id)
    requireBatchStatus(batch, 'draft', 'sent')
    const cutters = await tx.selectFrom('regrind_batch_items as i')
      .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'i.cutter_id').onRef('c.shop_id', '=', 'i.shop_id'))
      .select(['c.id', 'c.code', 'c.status', 'c.machine_id', 'c.diameter_mm'])
      .where('i.shop_id', '=', user.shopId).where('i.batch_id', '=', id)
      .orderBy('c.id')
      .forUpdate('c')
      .execute()
    if (!cutters.length) {
      throw createError({ statusCode: 409, statusMessage: `Batch ${batch.number} has no cutters. Add the cutters to send before sending it.` })
    }
    const changed = cutters.filter((c) => !(DUE_STATUSES as readonly string[]).includes(c.status))
    if (changed.length) {
      throw createError({
        statusCode: 409,
        statusMessage: `Some cutters changed since the batch was drafted: ${changed.map((c) => `${c.code} ${STATUS_SENTENCE[c.status]}`).join('; ')}. Take them out of the batch and send it again.`,
        data: { cutterIds: changed.map((c) => c.id) },
      })
    }

    const now = new Date()
    await tx.updateTable('cutters').set({ status: 'at_regrind', machine_id: null, updated_at: now })
      .where('shop_id', '=', user.shopId).where('id', 'in', cutters.map((c) => c.id))
      .execute()
    for (const c of cutters) {
      // The diameter it leaves at, in case it was measured again since the draft.
      await tx.updateTable('regrind_batch_items').set({ diameter_before_mm: c.diameter_mm })
        .where('shop_id', '=', user.shopId).where('batch_id', '=', id).where('cutter_id', '=', c.id)
        .execute()
      await recordEvent(tx, {
        shopId: user.shopId, cutterId: c.id, kind: 'sent_to_regrind', from: c.status, to: 'at_regrind',
        machineId: c.machine_id, actorId: user.id, note: `Batch ${batch.number}`,
      })
    }
    const { address } = await tx.selectFrom('shops').select('address').where('id', '=', user.shopId).executeTakeFirstOrThrow()
    await tx.updateTable('regrind_batches').set({ status: 'sent', sent_at: now, ship_to: address })
      .where('shop_id', '=', user.shopId).where('id', '=', id)
      .execute()
  })
  const batch = await requireRegrindBatchView(db, user.shopId, id)
  return { batch, mail: emailSupplier ? await mailBatchToSupplier(user, batch) : null }
}

const badItem = (index: number, field: string, message: string): never => badField(`items.${index}.${field}`, message)

/**
 * Receives cutters of a batch back from the regrinder, all at once or in parts: each listed
 * cutter either came back (its measured diameter decides: a new sharp life with regrind count + 1,
 * life used 0 and the shop's regrind life fraction, or retired undersize or past its regrinds,
 * shared/kerf/regrind.ts) or the regrinder scrapped it (retired, with the reason). Cutters not
 * listed stay out; the batch is received once every cutter is back or written off. Answers the
 * batch and what this receipt did.
 */
export async function receiveRegrindBatch(db: Db, user: SessionUser, id: number, items: z.output<typeof ReceiveBatchBody>['items']) {
  const receipt = await db.transaction().execute((tx) => receiveItems(tx, user, id, items))
  return { batch: await requireRegrindBatchView(db, user.shopId, id), receipt }
}

async function receiveItems(tx: Tx, user: SessionUser, batchId: number, items: z.output<typeof ReceiveBatchBody>['items']) {
  const shopId = user.shopId
  const batch = await lockRegrindBatch(tx, shopId, batchId)
  requireBatchStatus(batch, 'sent', 'received')
  const shop = await tx.selectFrom('shops').select('regrind_life_fraction').where('id', '=', shopId).executeTakeFirstOrThrow()
  const cutters = await tx.selectFrom('regrind_batch_items as i')
    .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'i.cutter_id').onRef('c.shop_id', '=', 'i.shop_id'))
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .select(['c.id', 'c.code', 'c.status', 'c.regrind_count', 'i.result', 't.max_regrinds', 't.min_usable_diameter_mm', 't.regrind_cost_cents'])
    .where('i.shop_id', '=', shopId).where('i.batch_id', '=', batchId)
    .orderBy('c.id')
    .forUpdate('c')
    .execute()

  const byId = new Map(cutters.map((c) => [c.id, c]))
  const seen = new Set<number>()
  items.forEach((item, index) => {
    const c = byId.get(item.cutterId)
    if (!c) return badItem(index, 'cutterId', 'is not in this batch')
    if (seen.has(item.cutterId)) badItem(index, 'cutterId', 'is listed twice')
    if (c.result !== null) badItem(index, 'cutterId', `${c.code} was already received from this batch`)
    seen.add(item.cutterId)
  })
  // A cutter that came back must still be out; one written off may have changed meanwhile.
  const away = items.filter((i) => i.scrapReason === undefined && byId.get(i.cutterId)!.status !== 'at_regrind').map((i) => byId.get(i.cutterId)!)
  if (away.length) {
    throw createError({
      statusCode: 409,
      statusMessage: `Some cutters are no longer out for resharpening: ${away.map((c) => `${c.code} ${STATUS_SENTENCE[c.status]}`).join('; ')}. Write them off instead.`,
      data: { cutterIds: away.map((c) => c.id) },
    })
  }

  const now = new Date()
  const outcome = { reground: 0, retired: 0, scrapped: 0 }
  for (const item of items) {
    const c = byId.get(item.cutterId)!
    if (item.scrapReason !== undefined) {
      if (c.status === 'at_regrind') {
        await tx.updateTable('cutters').set({ status: 'retired', machine_id: null, retired_reason: 'other', updated_at: now })
          .where('shop_id', '=', shopId).where('id', '=', c.id).execute()
        await recordEvent(tx, {
          shopId, cutterId: c.id, kind: 'retired', from: 'at_regrind', to: 'retired', actorId: user.id,
          note: `Scrapped by the regrinder: ${item.scrapReason} (batch ${batch.number})`,
        })
      }
      await tx.updateTable('regrind_batch_items').set({ result: 'retired', scrap_reason: item.scrapReason, cost_cents: item.costCents ?? 0, received_at: now })
        .where('shop_id', '=', shopId).where('batch_id', '=', batchId).where('cutter_id', '=', c.id).execute()
      outcome.scrapped++
      continue
    }
    const diameter = roundMm(item.diameterMm!)
    const verdict = receiptVerdict(diameter, c.regrind_count, { maxRegrinds: c.max_regrinds, minUsableDiameterMm: c.min_usable_diameter_mm })
    if (verdict.result === 'reground') {
      const life = afterRegrind(c.regrind_count, diameter, shop.regrind_life_fraction)
      await tx.updateTable('cutters').set({
        status: life.status, machine_id: null, diameter_mm: life.diameterMm, regrind_count: life.regrindCount, life_used: life.lifeUsed,
        life_scale: life.lifeScale, minutes_this_life: life.minutesThisLife, flagged: life.flagged, flagged_at: life.flaggedAt, updated_at: now,
      }).where('shop_id', '=', shopId).where('id', '=', c.id).execute()
      await recordEvent(tx, {
        shopId, cutterId: c.id, kind: 'reground', from: 'at_regrind', to: 'in_crib', actorId: user.id,
        note: `Reground to ${diameter.toFixed(3)} mm (batch ${batch.number})`,
      })
      outcome.reground++
    } else {
      await tx.updateTable('cutters').set({
        status: 'retired', machine_id: null, diameter_mm: diameter, retired_reason: RETIRED_REASON[verdict.cause!], updated_at: now,
      }).where('shop_id', '=', shopId).where('id', '=', c.id).execute()
      await recordEvent(tx, {
        shopId, cutterId: c.id, kind: 'retired', from: 'at_regrind', to: 'retired', actorId: user.id,
        note: verdict.cause === 'undersize'
          ? `Came back at ${diameter.toFixed(3)} mm, below the minimum usable ${c.min_usable_diameter_mm.toFixed(3)} mm (batch ${batch.number})`
          : `Came back from a regrind past the ${c.max_regrinds} this type allows (batch ${batch.number})`,
      })
      outcome.retired++
    }
    await tx.updateTable('regrind_batch_items').set({
      diameter_after_mm: diameter, result: verdict.result, cost_cents: item.costCents ?? c.regrind_cost_cents, received_at: now,
    }).where('shop_id', '=', shopId).where('batch_id', '=', batchId).where('cutter_id', '=', c.id).execute()
  }
  const stillOut = cutters.filter((c) => c.result === null && !seen.has(c.id)).length
  if (!stillOut) {
    await tx.updateTable('regrind_batches').set({ status: 'received', received_at: now })
      .where('shop_id', '=', shopId).where('id', '=', batchId).execute()
  }
  return { ...outcome, stillOut }
}
