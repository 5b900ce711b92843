// What the spindle routes share: locking a cutter of the shop for a change of state, and
// writing the event that records who changed it and when.
import type { Updateable } from 'kysely'
import type { CutterEventKind, CutterStatus } from '../../db/schema'
import type { CuttersTable } from '../../db/tables/spindle'
import type { Tx } from '../../db/connect'
import type { SessionUser } from '../platform/auth'

/** The cutter's row, locked until the transaction ends; 404 when it is not in the shop. */
export async function lockCutter(tx: Tx, shopId: number, id: number) {
  const row = await tx.selectFrom('cutters as c')
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .select(['c.id', 'c.code', 'c.status', 'c.machine_id', 'c.flagged', 'c.regrind_count', 'c.life_scale', 'c.life_used', 't.rated_life_minutes'])
    .where('c.shop_id', '=', shopId).where('c.id', '=', id)
    .forUpdate('c')
    .executeTakeFirst()
  if (!row) notFound('cutter')
  return row
}

export type LockedCutter = Awaited<ReturnType<typeof lockCutter>>

/** One change to a locked cutter: the columns it sets and the event that tells it. */
export interface CutterChange {
  set: Omit<Updateable<CuttersTable>, 'updated_at'>
  event: { kind: CutterEventKind, to: CutterStatus, machineId?: number | null, note?: string, photoId?: number | null }
}

/**
 * Changes one cutter of the person's shop in one transaction: locks it (404 when it is not the
 * shop's), lets `decide` refuse with a 409 or describe the change (nothing, for a harmless
 * repeat), writes the change and its event, and answers the cutter as the pages show it.
 */
export async function changeCutter(
  user: SessionUser, id: number, decide: (cutter: LockedCutter, tx: Tx) => CutterChange | undefined | Promise<CutterChange | undefined>,
) {
  await transaction(async (tx) => {
    const cutter = await lockCutter(tx, user.shopId, id)
    const change = await decide(cutter, tx)
    if (!change) return
    await tx.updateTable('cutters').set({ ...change.set, updated_at: new Date() })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    await recordEvent(tx, { shopId: user.shopId, cutterId: id, from: cutter.status, actorId: user.id, ...change.event })
  })
  return requireCutterView(useDb(), user.shopId, { id })
}

export interface CutterEvent {
  shopId: number, cutterId: number, kind: CutterEventKind, from: CutterStatus | null, to: CutterStatus | null,
  machineId?: number | null, actorId: number | null, note?: string, photoId?: number | null,
}

/** The cutter_events row of an event, for recordEvent and for routes that write it within a larger statement. */
export function eventRow(e: CutterEvent) {
  return {
    shop_id: e.shopId, cutter_id: e.cutterId, kind: e.kind, from_status: e.from, to_status: e.to,
    machine_id: e.machineId ?? null, actor_id: e.actorId, note: e.note ?? '', photo_id: e.photoId ?? null,
  }
}

export async function recordEvent(tx: Tx, e: CutterEvent): Promise<void> {
  await tx.insertInto('cutter_events').values(eventRow(e)).execute()
}

export const STATUS_SENTENCE: Record<CutterStatus, string> = {
  in_crib: 'is in the crib',
  in_spindle: 'is loaded in a machine',
  at_regrind: 'is out for resharpening',
  retired: 'is retired',
  lost: 'is marked lost',
}
