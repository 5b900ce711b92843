// The catalogue as the routes answer it: cutter types in camelCase with their supplier and stock
// by status, suppliers with how many types they sell; and the checks the writes share.
import { sql } from 'kysely'
import type { CutterTypeValue } from '#shared/schemas/crib'
import { CUTTER_STATUSES, type CutterStatus } from '#shared/kerf/status'
import type { Queryable } from '../../db/connect'

function typeQuery(db: Queryable, shopId: number) {
  return db.selectFrom('cutter_types as t')
    .leftJoin('suppliers as s', (j) => j.onRef('s.id', '=', 't.supplier_id').onRef('s.shop_id', '=', 't.shop_id'))
    .selectAll('t')
    .select(['s.name as supplier_name', 's.lead_time_days as supplier_lead_time_days'])
    .where('t.shop_id', '=', shopId)
}
type TypeRow = Awaited<ReturnType<ReturnType<typeof typeQuery>['executeTakeFirstOrThrow']>>
export type Stock = Record<CutterStatus, number>

function typeView(t: TypeRow, stock: Stock) {
  return {
    id: t.id,
    name: t.name,
    supplierId: t.supplier_id,
    supplierName: t.supplier_name,
    supplierPartNumber: t.supplier_part_number,
    profile: t.profile,
    vAngleDeg: t.v_angle_deg,
    helix: t.helix,
    toolMaterial: t.tool_material,
    flutes: t.flutes,
    cuttingDiameterMm: t.cutting_diameter_mm,
    shankDiameterMm: t.shank_diameter_mm,
    cuttingLengthMm: t.cutting_length_mm,
    overallLengthMm: t.overall_length_mm,
    ratedLifeMinutes: t.rated_life_minutes,
    maxRegrinds: t.max_regrinds,
    regrindDiameterLossMm: t.regrind_diameter_loss_mm,
    minUsableDiameterMm: t.min_usable_diameter_mm,
    unitCostCents: t.unit_cost_cents,
    regrindCostCents: t.regrind_cost_cents,
    packSize: t.pack_size,
    serviceLevel: t.service_level,
    leadTimeDaysOverride: t.lead_time_days_override,
    /** The lead time in force: the type's own, else its supplier's. */
    leadTimeDays: t.lead_time_days_override ?? t.supplier_lead_time_days ?? null,
    active: t.active,
    createdAt: t.created_at,
    stock,
  }
}
export type CutterTypeView = ReturnType<typeof typeView>
/** A cutter type as the client receives it (dates as text). */
export type CutterTypeJson = Omit<CutterTypeView, 'createdAt'> & { createdAt: string }

async function stockByType(db: Queryable, shopId: number, typeId?: number): Promise<Map<number, Stock>> {
  let q = db.selectFrom('cutters').select(['type_id', 'status', (eb) => eb.fn.countAll<number>().as('n')])
    .where('shop_id', '=', shopId)
  if (typeId !== undefined) q = q.where('type_id', '=', typeId)
  const stock = new Map<number, Stock>()
  for (const r of await q.groupBy(['type_id', 'status']).execute()) {
    if (!stock.has(r.type_id)) stock.set(r.type_id, emptyStock())
    stock.get(r.type_id)![r.status] = Number(r.n)
  }
  return stock
}
const emptyStock = () => Object.fromEntries(CUTTER_STATUSES.map((s) => [s, 0])) as Stock

export async function listCutterTypes(db: Queryable, shopId: number, opts: { includeArchived: boolean }) {
  let q = typeQuery(db, shopId)
  if (!opts.includeArchived) q = q.where('t.active', '=', true)
  const [rows, stock] = await Promise.all([q.orderBy('t.name').execute(), stockByType(db, shopId)])
  return rows.map((t) => typeView(t, stock.get(t.id) ?? emptyStock()))
}

/** One type of the shop, or a 404. */
export async function requireCutterType(db: Queryable, shopId: number, id: number) {
  const [row, stock] = await Promise.all([typeQuery(db, shopId).where('t.id', '=', id).executeTakeFirst(), stockByType(db, shopId, id)])
  if (!row) notFound('cutter type')
  return typeView(row, stock.get(id) ?? emptyStock())
}

/** The columns of a type from the form's fields; fields left out stay undefined, which Kysely skips. */
export function cutterTypeColumns(v: Partial<CutterTypeValue>) {
  return {
    name: v.name,
    supplier_id: v.supplierId,
    supplier_part_number: v.supplierPartNumber,
    profile: v.profile,
    v_angle_deg: v.vAngleDeg,
    helix: v.helix,
    tool_material: v.toolMaterial,
    flutes: v.flutes,
    cutting_diameter_mm: v.cuttingDiameterMm,
    shank_diameter_mm: v.shankDiameterMm,
    cutting_length_mm: v.cuttingLengthMm,
    overall_length_mm: v.overallLengthMm,
    rated_life_minutes: v.ratedLifeMinutes,
    max_regrinds: v.maxRegrinds,
    regrind_diameter_loss_mm: v.regrindDiameterLossMm,
    min_usable_diameter_mm: v.minUsableDiameterMm,
    unit_cost_cents: v.unitCostCents,
    regrind_cost_cents: v.regrindCostCents,
    pack_size: v.packSize,
    service_level: v.serviceLevel,
    lead_time_days_override: v.leadTimeDaysOverride,
  }
}

/** 400 naming each field, like parseWith, for rules checked after the schema. */
export function badFields(fields: Record<string, string>): void {
  const entries = Object.entries(fields)
  if (!entries.length) return
  throw createError({ statusCode: 400, statusMessage: entries.map(([f, m]) => `${f}: ${m}`).join('; '), data: { fields } })
}

const WHAT = { cutter_types: 'cutter type', suppliers: 'supplier', machines: 'machine', materials: 'material' } as const

/** 409 when another row of the shop has the name, whatever its case. */
export async function assertNameFree(db: Queryable, table: keyof typeof WHAT, shopId: number, name: string, exceptId?: number) {
  let q = db.selectFrom(table).select('id').where('shop_id', '=', shopId).where(sql<string>`lower(name)`, '=', name.toLowerCase())
  if (exceptId !== undefined) q = q.where('id', '<>', exceptId)
  if (await q.executeTakeFirst()) nameTaken(table)
}

export function nameTaken(table: keyof typeof WHAT): never {
  const message = `another ${WHAT[table]} already has this name (archived ones count too). Choose another name.`
  throw createError({ statusCode: 409, statusMessage: `name: ${message}`, data: { fields: { name: message } } })
}

/** Runs a write; two people saving the same name (in any case) at once meet the unique index, which answers 409 too. */
export async function withUniqueName<T>(table: keyof typeof WHAT, write: () => Promise<T>): Promise<T> {
  try {
    return await write()
  } catch (err) {
    const { code, constraint } = err as { code?: string, constraint?: string }
    if (code === '23505' && constraint === `${table}_shop_id_lower_name_key`) {
      nameTaken(table)
    }
    throw err
  }
}

/** A supplier id from a form must be one of the shop's. */
export async function assertSupplier(db: Queryable, shopId: number, supplierId: number | null | undefined) {
  if (supplierId === null || supplierId === undefined) return
  const found = await db.selectFrom('suppliers').select('id').where('shop_id', '=', shopId).where('id', '=', supplierId).executeTakeFirst()
  if (!found) badFields({ supplierId: 'no such supplier in your shop' })
}

export function supplierQuery(db: Queryable, shopId: number) {
  return db.selectFrom('suppliers as s')
    .select(['s.id', 's.name', 's.email', 's.phone', 's.lead_time_days as leadTimeDays', 's.note', 's.active', 's.created_at as createdAt',
      (eb) => eb.selectFrom('cutter_types as t').select((e) => e.fn.countAll<number>().as('n'))
        .whereRef('t.shop_id', '=', 's.shop_id').whereRef('t.supplier_id', '=', 's.id').where('t.active', '=', true).as('typeCount')])
    .where('s.shop_id', '=', shopId)
}

export async function requireSupplier(db: Queryable, shopId: number, id: number) {
  const row = await supplierQuery(db, shopId).where('s.id', '=', id).executeTakeFirst()
  if (!row) notFound('supplier')
  return { ...row, typeCount: Number(row.typeCount) }
}
