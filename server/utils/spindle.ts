// What the spindle routes share: locking a cutter of the shop for a change of state, and
// writing the event that records who changed it and when.
import type { CutterEventKind, CutterStatus } from '../db/schema'
import type { Tx } from '../db/connect'

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
