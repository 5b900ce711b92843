// Sending a resharpening batch to the regrinder and receiving it back: the two writes that move a
// batch along, each one transaction under the batch's and its cutters' row locks.
import { DUE_STATUSES } from '#shared/kerf/due'
import { RETIRED_REASON, receiptVerdict, roundMm } from '#shared/kerf/regrind'
import type { ReceiveBatchBody } from '#shared/schemas/regrind'
import type { z } from 'zod'
import type { Db } from '../../db/connect'
import type { SessionUser } from '../platform/auth'
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

function badItem(index: number, field: string, message: string): never {
  const key = `items.${index}.${field}`
  throw createError({ statusCode: 400, statusMessage: `${key}: ${message}`, data: { fields: { [key]: message } } })
}

/**
 * Receives a batch back from the regrinder, every cutter with its measured diameter. Each one
 * either starts a new sharp life (regrind count + 1, life used 0, life scale = the shop's
 * regrind life fraction) or, when it came back below the type's minimum usable diameter or past
 * its maximum regrinds, is retired instead (shared/kerf/regrind.ts decides). A second receipt of
 * the same batch is a 409.
 */
export async function receiveRegrindBatch(db: Db, user: SessionUser, id: number, items: z.output<typeof ReceiveBatchBody>['items']) {
  await db.transaction().execute(async (tx) => {
    const batch = await lockRegrindBatch(tx, user.shopId, id)
    requireBatchStatus(batch, 'sent', 'received')
    const shop = await tx.selectFrom('shops').select('regrind_life_fraction').where('id', '=', user.shopId).executeTakeFirstOrThrow()
    const cutters = await tx.selectFrom('regrind_batch_items as i')
      .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'i.cutter_id').onRef('c.shop_id', '=', 'i.shop_id'))
      .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
      .select(['c.id', 'c.code', 'c.status', 'c.regrind_count', 't.max_regrinds', 't.min_usable_diameter_mm', 't.regrind_cost_cents'])
      .where('i.shop_id', '=', user.shopId).where('i.batch_id', '=', id)
      .orderBy('c.id')
      .forUpdate('c')
      .execute()

    const byId = new Map(cutters.map((c) => [c.id, c]))
    const seen = new Set<number>()
    items.forEach((item, index) => {
      if (!byId.has(item.cutterId)) badItem(index, 'cutterId', 'is not in this batch')
      if (seen.has(item.cutterId)) badItem(index, 'cutterId', 'is listed twice')
      seen.add(item.cutterId)
    })
    const missing = cutters.filter((c) => !seen.has(c.id))
    if (missing.length) {
      throw createError({
        statusCode: 400,
        statusMessage: `items: enter the measured diameter of every cutter in the batch; missing ${missing.map((c) => c.code).join(', ')}`,
        data: { fields: { items: `missing ${missing.map((c) => c.code).join(', ')}` } },
      })
    }
    const away = cutters.filter((c) => c.status !== 'at_regrind')
    if (away.length) {
      throw createError({
        statusCode: 409,
        statusMessage: `Some cutters are no longer out for resharpening: ${away.map((c) => `${c.code} ${STATUS_SENTENCE[c.status]}`).join('; ')}.`,
        data: { cutterIds: away.map((c) => c.id) },
      })
    }

    const now = new Date()
    for (const item of items) {
      const c = byId.get(item.cutterId)!
      const diameter = roundMm(item.diameterMm)
      const verdict = receiptVerdict(diameter, c.regrind_count, { maxRegrinds: c.max_regrinds, minUsableDiameterMm: c.min_usable_diameter_mm })
      if (verdict.result === 'reground') {
        await tx.updateTable('cutters').set({
          status: 'in_crib', machine_id: null, diameter_mm: diameter, regrind_count: c.regrind_count + 1,
          life_used: 0, life_scale: shop.regrind_life_fraction, minutes_this_life: 0, flagged: null, flagged_at: null, updated_at: now,
        }).where('shop_id', '=', user.shopId).where('id', '=', c.id).execute()
        await recordEvent(tx, {
          shopId: user.shopId, cutterId: c.id, kind: 'reground', from: 'at_regrind', to: 'in_crib', actorId: user.id,
          note: `Reground to ${diameter.toFixed(3)} mm (batch ${batch.number})`,
        })
      } else {
        await tx.updateTable('cutters').set({
          status: 'retired', machine_id: null, diameter_mm: diameter, retired_reason: RETIRED_REASON[verdict.cause!], updated_at: now,
        }).where('shop_id', '=', user.shopId).where('id', '=', c.id).execute()
        await recordEvent(tx, {
          shopId: user.shopId, cutterId: c.id, kind: 'retired', from: 'at_regrind', to: 'retired', actorId: user.id,
          note: verdict.cause === 'undersize'
            ? `Came back at ${diameter.toFixed(3)} mm, below the minimum usable ${c.min_usable_diameter_mm.toFixed(3)} mm (batch ${batch.number})`
            : `Came back from a regrind past the ${c.max_regrinds} this type allows (batch ${batch.number})`,
        })
      }
      await tx.updateTable('regrind_batch_items').set({
        diameter_after_mm: diameter, result: verdict.result, cost_cents: item.costCents ?? c.regrind_cost_cents,
      }).where('shop_id', '=', user.shopId).where('batch_id', '=', id).where('cutter_id', '=', c.id).execute()
    }
    await tx.updateTable('regrind_batches').set({ status: 'received', received_at: now })
      .where('shop_id', '=', user.shopId).where('id', '=', id)
      .execute()
  })
  return requireRegrindBatchView(db, user.shopId, id)
}
