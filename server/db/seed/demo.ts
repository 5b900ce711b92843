// Builds the invented demo shop "Millrace Signs & Displays" with a year of history, in one
// transaction. Running it again changes nothing: the shop's name is the marker.
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { sql, type Insertable } from 'kysely'
import type { Db, Tx } from '../connect'
import type { Database } from '../schema'
import { startingChipLoadRows } from '../../utils/spindle/chip-loads'
import {
  CRIB_EMAIL, CUTTER_TYPES, DEMO_PASSWORD, DEMO_SHOP, MACHINES, MATERIALS, OPEN_ORDER, PEOPLE, REGRIND_SUPPLIER, SUPPLIERS,
} from './demo-data'
import { BATCH_SENDS, DAY, cleanupMinutes, OPEN_BATCH_SEND, OPEN_ORDER_DAY, ORDER_DAYS, Random, TURNAROUND, mulberry32, simulateYear, type History } from './demo-history'

export { DEMO_PASSWORD, DEMO_SHOP, PEOPLE as DEMO_PEOPLE } from './demo-data'

const SEED = 0x4B3F
const CHUNK = 500
const HOUR = 3_600_000

export async function seedDemoShop(db: Db): Promise<{ created: boolean, shopId: number }> {
  return db.transaction().execute(async (tx) => {
    // Two seeds started together must not both see "no shop yet".
    await sql`select pg_advisory_xact_lock(hashtext('kerfbook.seed.demo'))`.execute(tx)
    const existing = await tx.selectFrom('shops').select('id').where('name', '=', DEMO_SHOP.name).executeTakeFirst()
    if (existing) return { created: false, shopId: existing.id }

    // A year of history ending yesterday: day 0 is midnight UTC 365 days before yesterday.
    const today = new Date()
    const dayZero = Date.UTC(today.getUTCFullYear(), today.getUTCMonth(), today.getUTCDate()) - 366 * DAY
    const history = simulateYear(SEED, dayZero)
    await avoidTakenCodes(tx, history)
    const shopId = await writeShop(tx, history, dayZero)
    return { created: true, shopId }
  })
}

/** Label codes are global; in the unlikely case another shop holds one of ours, draw again. */
async function avoidTakenCodes(tx: Tx, history: History) {
  const codes = history.cutters.map((c) => c.code)
  const taken = new Set((await tx.selectFrom('cutters').select('code').where('code', 'in', codes).execute()).map((r) => r.code))
  if (!taken.size) return
  const rng = new Random(mulberry32(SEED + 1))
  const used = new Set(codes)
  for (const c of history.cutters) {
    if (!taken.has(c.code)) continue
    do c.code = rng.labelCode()
    while (taken.has(c.code) || used.has(c.code))
    used.add(c.code)
  }
}

async function writeShop(tx: Tx, h: History, dayZero: number): Promise<number> {
  const at = (day: number, hour: number) => new Date(dayZero + day * DAY + hour * HOUR)
  const setUp = at(-7, 9)
  const passwordHash = await new Hash(new Scrypt({})).make(DEMO_PASSWORD)

  const shop = await tx.insertInto('shops').values({
    name: DEMO_SHOP.name, report_recipients: DEMO_SHOP.reportRecipients, life_threshold: DEMO_SHOP.lifeThreshold,
    regrind_life_fraction: DEMO_SHOP.regrindLifeFraction, labour_rate_cents_per_hour: DEMO_SHOP.labourRateCentsPerHour, created_at: setUp,
  }).returning('id').executeTakeFirstOrThrow()
  const shopId = shop.id

  const users = await tx.insertInto('users')
    .values(PEOPLE.map((p) => ({ shop_id: shopId, email: p.email, name: p.name, role: p.role, password_hash: passwordHash, created_at: setUp, email_confirmed_at: setUp })))
    .returning(['id', 'email']).execute()
  // Every demo person has an address (only operators added by name have none).
  const userId = idsBy(users.map((u) => ({ id: u.id, email: u.email ?? '' })), 'email')
  const crib = userId(CRIB_EMAIL)

  const machines = await tx.insertInto('machines').values(MACHINES.map((m) => ({
    shop_id: shopId, name: m.name, description: m.description, min_rpm: m.minRpm, max_rpm: m.maxRpm, pockets: m.pockets, created_at: setUp,
  }))).returning(['id', 'name']).execute()
  const machineId = (key: string) => idsBy(machines, 'name')(MACHINES.find((m) => m.key === key)!.name)

  const materials = await tx.insertInto('materials').values(MATERIALS.map((m) => ({
    shop_id: shopId, name: m.name, family: m.family, wear_factor: m.wearFactor, common: m.common, created_at: setUp,
  }))).returning(['id', 'name']).execute()
  const materialId = idsBy(materials, 'name')
  await tx.insertInto('chip_loads').values(startingChipLoadRows(shopId).map((r) => ({ ...r, updated_at: setUp }))).execute()

  const suppliers = await tx.insertInto('suppliers').values(SUPPLIERS.map((s) => ({
    shop_id: shopId, name: s.name, email: s.email, phone: s.phone, lead_time_days: s.leadTimeDays, note: s.note, created_at: setUp,
  }))).returning(['id', 'name']).execute()
  const supplierId = (key: string) => idsBy(suppliers, 'name')(SUPPLIERS.find((s) => s.key === key)!.name)

  const types = await tx.insertInto('cutter_types').values(CUTTER_TYPES.map((t) => ({
    shop_id: shopId, supplier_id: supplierId(t.supplier), supplier_part_number: t.part, name: t.name, profile: t.profile,
    v_angle_deg: t.vAngle, helix: t.helix, tool_material: 'solid_carbide' as const, flutes: t.flutes,
    cutting_diameter_mm: t.diameter, shank_diameter_mm: t.shank, cutting_length_mm: t.cutLength,
    overall_length_mm: t.overallLength, rated_life_minutes: t.ratedLife, max_regrinds: t.maxRegrinds,
    regrind_diameter_loss_mm: t.regrindLoss, min_usable_diameter_mm: t.minUsable, unit_cost_cents: t.unitCost,
    regrind_cost_cents: t.regrindCost, pack_size: t.packSize, service_level: 0.95, lead_time_days_override: t.leadTimeOverride,
    created_at: setUp,
  }))).returning(['id', 'name']).execute()
  const typeId = (key: string) => idsBy(types, 'name')(CUTTER_TYPES.find((t) => t.key === key)!.name)

  // Purchase orders, one per supplier: the opening stock and the replacements (received), and the restocking still open.
  const lineIds = new Map<string, number>()
  const order = async (supplier: string, sentDay: number, receivedDay: number | null, note: string, quantities: Map<string, number>) => {
    const row = await tx.insertInto('purchase_orders').values({
      shop_id: shopId, supplier_id: supplierId(supplier), status: receivedDay === null ? 'sent' : 'received', note,
      created_by: crib, created_at: at(sentDay, 9), sent_at: at(sentDay, 10), received_at: receivedDay === null ? null : at(receivedDay, 11),
    }).returning('id').executeTakeFirstOrThrow()
    return tx.insertInto('purchase_order_lines').values([...quantities].map(([key, n]) => ({
      shop_id: shopId, order_id: row.id, type_id: typeId(key), quantity: n, received_quantity: receivedDay === null ? 0 : n,
      unit_cost_cents: CUTTER_TYPES.find((t) => t.key === key)!.unitCost,
    }))).returning(['id', 'type_id']).execute()
  }
  const received = [
    { origin: 'A' as const, sentDay: ORDER_DAYS.A - 6, note: 'Opening stock for the year' },
    { origin: 'B' as const, sentDay: ORDER_DAYS.B - 8, note: 'Replacements for worn and broken bits' },
  ]
  for (const o of received) {
    for (const s of SUPPLIERS) {
      const quantities = countBy(h.cutters.filter((c) => c.origin === o.origin && c.type.supplier === s.key).map((c) => c.type.key))
      if (!quantities.size) continue
      for (const l of await order(s.key, o.sentDay, ORDER_DAYS[o.origin], o.note, quantities)) lineIds.set(`${o.origin}:${l.type_id}`, l.id)
    }
  }
  for (const s of SUPPLIERS) {
    const quantities = new Map(Object.entries(OPEN_ORDER).filter(([key]) => CUTTER_TYPES.find((t) => t.key === key)!.supplier === s.key))
    if (quantities.size) await order(s.key, OPEN_ORDER_DAY, null, 'Restocking before the busy season', quantities)
  }

  // Resharpening runs that carried at least one cutter, plus the one still out.
  const batchIds = new Map<number, number>()
  for (const b of [...new Set(h.items.map((i) => i.batch))].sort((x, y) => (x < 0 ? 1 : y < 0 ? -1 : x - y))) {
    const send = b < 0 ? OPEN_BATCH_SEND : BATCH_SENDS[b]!
    const row = await tx.insertInto('regrind_batches').values({
      shop_id: shopId, supplier_id: supplierId(REGRIND_SUPPLIER), status: b < 0 ? 'sent' : 'received',
      note: b < 0 ? 'Still at the regrinder' : `Resharpening run ${b + 1}`, created_by: crib,
      created_at: at(send, 8), sent_at: at(send, 10), received_at: b < 0 ? null : at(send + TURNAROUND, 11),
    }).returning('id').executeTakeFirstOrThrow()
    batchIds.set(b, row.id)
  }

  // Cutters loaded in a machine with a tool changer sit in its pockets, 1 upwards.
  const filled = new Map<string, number>()
  const pocketOf = (c: { status: string, machine?: string | null }): number | null => {
    const pockets = c.machine && c.status === 'in_spindle' ? MACHINES.find((m) => m.key === c.machine)!.pockets : 0
    if (!pockets) return null
    const next = (filled.get(c.machine!) ?? 0) + 1
    filled.set(c.machine!, next)
    return next <= pockets ? next : null
  }
  const cutters = await tx.insertInto('cutters').values(h.cutters.map((c) => ({
    shop_id: shopId, type_id: typeId(c.type.key), code: c.code, status: c.status, machine_id: c.machine ? machineId(c.machine) : null,
    pocket: pocketOf(c),
    diameter_mm: c.diameter, regrind_count: c.regrindCount, life_scale: c.lifeScale, life_used: c.lifeUsed,
    minutes_this_life: c.minutesThisLife, minutes_total: c.minutesTotal, flagged: c.flagged,
    flagged_at: c.flaggedAt ? new Date(c.flaggedAt) : null, retired_reason: c.retiredReason,
    order_line_id: lineIds.get(`${c.origin}:${typeId(c.type.key)}`) ?? null,
    received_at: new Date(c.receivedAt), updated_at: new Date(c.updatedAt),
  }))).returning(['id', 'code']).execute()
  const byCode = idsBy(cutters, 'code')
  const cutterId = (index: number) => byCode(h.cutters[index]!.code)

  // Oldest first, so ids run with time.
  const cuts = [...h.cuts].sort((a, b) => a.at - b.at)
  await insertChunks(tx, 'cut_logs', cuts.map((c, n) => ({
    shop_id: shopId, cutter_id: cutterId(c.cutter), machine_id: machineId(c.machine), operator_id: userId(c.operator),
    material_id: materialId(c.material.name), minutes: c.minutes, wear_factor: c.material.wearFactor, life_added: c.lifeAdded,
    regrind_count: c.regrindCount, rpm: c.rpm, feed_mm_per_min: c.feed, outcome: c.outcome, note: c.note,
    cleanup_minutes_per_part: cleanupMinutes(c, h.cutters[c.cutter]!.type, n),
    idempotency_key: `seed-cut-${String(n + 1).padStart(5, '0')}`, cut_at: new Date(c.at), created_at: new Date(c.at),
  })))
  const events = [...h.events].sort((a, b) => a.at - b.at)
  await insertChunks(tx, 'cutter_events', events.map((e) => ({
    shop_id: shopId, cutter_id: cutterId(e.cutter), kind: e.kind, from_status: e.from, to_status: e.to,
    machine_id: e.machine ? machineId(e.machine) : null, actor_id: userId(e.actor), note: e.note, created_at: new Date(e.at),
  })))
  await insertChunks(tx, 'regrind_batch_items', h.items.map((i) => ({
    shop_id: shopId, batch_id: batchIds.get(i.batch)!, cutter_id: cutterId(i.cutter), diameter_before_mm: i.before,
    diameter_after_mm: i.after, result: i.result, cost_cents: i.cost,
  })))
  return shopId
}

/** Big inserts in slices, well under PostgreSQL's 65,535 parameters per statement. */
async function insertChunks<T extends 'cut_logs' | 'cutter_events' | 'regrind_batch_items'>(tx: Tx, table: T, rows: Insertable<Database[T]>[]) {
  for (let i = 0; i < rows.length; i += CHUNK) {
    await tx.insertInto(table).values(rows.slice(i, i + CHUNK)).execute()
  }
}

function idsBy<K extends string>(rows: ({ id: number } & Record<K, string>)[], key: K): (value: string) => number {
  const map = new Map<string, number>(rows.map((r) => [r[key], r.id]))
  return (value) => {
    const id = map.get(value)
    if (id === undefined) throw new Error(`demo seed: nothing called ${value}`)
    return id
  }
}

function countBy(keys: string[]): Map<string, number> {
  const counts = new Map<string, number>()
  for (const k of keys) counts.set(k, (counts.get(k) ?? 0) + 1)
  return counts
}
