// The shop's machines as the routes answer them, with the cutters each holds now.
import type { Queryable } from '../../db/connect'

export interface MachineView {
  id: number
  name: string
  description: string
  minRpm: number
  maxRpm: number
  /** Tool-changer pockets; 0 is a manual collet that holds one cutter. */
  pockets: number
  spindlePowerKw: number | null
  bedXMm: number | null
  bedYMm: number | null
  active: boolean
  retiredAt: Date | null
  /** Loaded cutters; `pocket` is the tool-changer pocket (null in a manual collet). */
  loaded: Array<{ id: number, code: string, pocket: number | null }>
}

export async function listMachines(db: Queryable, shopId: number, opts: { id?: number, retired?: boolean } = {}): Promise<MachineView[]> {
  let q = db.selectFrom('machines')
    .select(['id', 'name', 'description', 'min_rpm', 'max_rpm', 'pockets', 'spindle_power_kw', 'bed_x_mm', 'bed_y_mm', 'active', 'retired_at'])
    .where('shop_id', '=', shopId)
  if (opts.id !== undefined) q = q.where('id', '=', opts.id)
  if (!opts.retired) q = q.where('active', '=', true)
  const rows = await q.orderBy('active', 'desc').orderBy('name').execute()
  if (!rows.length) return []
  const loaded = await db.selectFrom('cutters').select(['id', 'code', 'machine_id', 'pocket'])
    .where('shop_id', '=', shopId).where('status', '=', 'in_spindle').where('machine_id', 'in', rows.map((r) => r.id))
    .orderBy('pocket').orderBy('code').execute()
  return rows.map((m) => ({
    id: m.id,
    name: m.name,
    description: m.description,
    minRpm: m.min_rpm,
    maxRpm: m.max_rpm,
    pockets: m.pockets,
    spindlePowerKw: m.spindle_power_kw,
    bedXMm: m.bed_x_mm,
    bedYMm: m.bed_y_mm,
    active: m.active,
    retiredAt: m.retired_at,
    loaded: loaded.filter((c) => c.machine_id === m.id).map((c) => ({ id: c.id, code: c.code, pocket: c.pocket })),
  }))
}

/** One machine of the shop (retired too), or 404. */
export async function requireMachine(db: Queryable, shopId: number, id: number): Promise<MachineView> {
  const [machine] = await listMachines(db, shopId, { id, retired: true })
  if (!machine) notFound('machine')
  return machine
}

/** The machine's row, locked until the transaction ends (loads, retiring and pocket changes queue on it); 404 when not the shop's. */
export async function lockMachine(db: Queryable, shopId: number, id: number) {
  const row = await db.selectFrom('machines').select(['id', 'name', 'pockets', 'min_rpm', 'max_rpm', 'active'])
    .where('shop_id', '=', shopId).where('id', '=', id).forNoKeyUpdate().executeTakeFirst()
  if (!row) notFound('machine')
  return row
}

/** "T4KX9QZ" or "T4KX9QZ, B7HH2MC and 3 more": the cutters a 409 names. */
export function cutterList(codes: string[]): string {
  if (codes.length <= 3) return codes.length > 1 ? `${codes.slice(0, -1).join(', ')} and ${codes.at(-1)}` : codes.join('')
  return `${codes.slice(0, 3).join(', ')} and ${codes.length - 3} more`
}
