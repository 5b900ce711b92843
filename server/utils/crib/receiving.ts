// New cutters into the crib: each gets a fresh label code and a 'received' event. Used by
// receiving a purchase order, an ad-hoc delivery and the CSV import, inside their transaction.
import { sql } from 'kysely'
import { newLabelCode } from '#shared/kerf/label-code'
import type { CutterStatus } from '../../db/schema'
import type { Tx } from '../../db/connect'

export interface NewCutter {
  typeId: number
  diameterMm: number
  orderLineId?: number | null
  /** For imports of cutters already in use; new stock starts in the crib, sharp. */
  status?: Extract<CutterStatus, 'in_crib' | 'at_regrind' | 'lost'>
  regrindCount?: number
  lifeUsed?: number
  lifeScale?: number
  note?: string
}

/** Label codes not yet used by any shop (codes are global because /c/<code> is). */
async function freshCodes(tx: Tx, count: number): Promise<string[]> {
  const codes = new Set<string>()
  while (codes.size < count) {
    const candidates = Array.from({ length: count - codes.size }, () => newLabelCode()).filter((c) => !codes.has(c))
    const taken = new Set((await tx.selectFrom('cutters').select('code').where('code', 'in', candidates).execute()).map((r) => r.code))
    for (const c of candidates) if (!taken.has(c)) codes.add(c)
  }
  return [...codes]
}

export async function createCutters(tx: Tx, shopId: number, actorId: number, cutters: readonly NewCutter[]) {
  if (!cutters.length) return []
  // Two receipts at once could draw the same random code; the advisory lock makes them take turns.
  await sql`select pg_advisory_xact_lock(hashtext('kerfbook:label-codes'))`.execute(tx)
  const codes = await freshCodes(tx, cutters.length)
  const rows = await tx.insertInto('cutters').values(cutters.map((c, i) => ({
    shop_id: shopId,
    type_id: c.typeId,
    code: codes[i]!,
    status: c.status ?? 'in_crib',
    diameter_mm: c.diameterMm,
    regrind_count: c.regrindCount ?? 0,
    life_used: c.lifeUsed ?? 0,
    life_scale: c.lifeScale ?? 1,
    order_line_id: c.orderLineId ?? null,
  }))).returning(['id', 'code', 'type_id', 'status']).execute()
  await tx.insertInto('cutter_events').values(rows.map((r, i) => ({
    shop_id: shopId, cutter_id: r.id, kind: 'received' as const, from_status: null, to_status: r.status,
    actor_id: actorId, note: cutters[i]!.note ?? '',
  }))).execute()
  return rows
}
