// Puts a regrind supplier, a machine, a regrindable cutter type and cutters in chosen states
// into a test shop, straight into the database.
import { newLabelCode } from '../../shared/kerf/label-code'
import { appDb } from './db'

/** The type every regrind test uses: 1/4" bit, two regrinds of 0.15 mm, usable down to 6.000 mm. */
export const REGRIND_TYPE = {
  ratedLifeMinutes: 600, maxRegrinds: 2, lossMm: 0.15, minUsableMm: 6, regrindCostCents: 1400,
} as const

export interface CutterSetup {
  lifeUsed?: number
  flagged?: 'dull' | null
  regrindCount?: number
  diameterMm?: number
  status?: 'in_crib' | 'in_spindle' | 'at_regrind' | 'retired' | 'lost'
}

export interface RegrindFixture {
  supplier: { id: number, email: string }
  machineId: number
  typeId: number
  add: (setups: CutterSetup[]) => Promise<Array<{ id: number, code: string }>>
}

export async function addRegrindFixture(shopId: number, supplierEmail: string): Promise<RegrindFixture> {
  const db = appDb()
  try {
    const supplier = await db.insertInto('suppliers').values({ shop_id: shopId, name: 'Test Regrind Works', email: supplierEmail })
      .returning('id').executeTakeFirstOrThrow()
    const machine = await db.insertInto('machines').values({ shop_id: shopId, name: 'Test table', min_rpm: 6000, max_rpm: 24000, pockets: 8 })
      .returning('id').executeTakeFirstOrThrow()
    const type = await db.insertInto('cutter_types').values({
      shop_id: shopId, supplier_id: supplier.id, name: 'Two-flute upcut 1/4" regrindable', profile: 'square_end', helix: 'upcut', flutes: 2,
      cutting_diameter_mm: 6.35, shank_diameter_mm: 6.35, cutting_length_mm: 22, overall_length_mm: 64,
      rated_life_minutes: REGRIND_TYPE.ratedLifeMinutes, max_regrinds: REGRIND_TYPE.maxRegrinds, regrind_diameter_loss_mm: REGRIND_TYPE.lossMm,
      min_usable_diameter_mm: REGRIND_TYPE.minUsableMm, unit_cost_cents: 3900, regrind_cost_cents: REGRIND_TYPE.regrindCostCents,
    }).returning('id').executeTakeFirstOrThrow()
    return { supplier: { id: supplier.id, email: supplierEmail }, machineId: machine.id, typeId: type.id, add: (setups) => addCutters(shopId, type.id, machine.id, setups) }
  } finally {
    await db.destroy()
  }
}

async function addCutters(shopId: number, typeId: number, machineId: number, setups: CutterSetup[]) {
  const db = appDb()
  try {
    return await db.insertInto('cutters').values(setups.map((s) => ({
      shop_id: shopId, type_id: typeId, code: newLabelCode(), status: s.status ?? 'in_crib',
      machine_id: s.status === 'in_spindle' ? machineId : null, diameter_mm: s.diameterMm ?? 6.35,
      regrind_count: s.regrindCount ?? 0, life_used: s.lifeUsed ?? 0, flagged: s.flagged ?? null,
      flagged_at: s.flagged ? new Date() : null, retired_reason: s.status === 'retired' ? 'other' as const : null,
    }))).returning(['id', 'code']).execute()
  } finally {
    await db.destroy()
  }
}

/** A cutter's row, its events (oldest first) and its batch items, read straight from the database. */
export async function cutterState(cutterId: number) {
  const db = appDb()
  try {
    const [cutter, events, items] = await Promise.all([
      db.selectFrom('cutters').selectAll().where('id', '=', cutterId).executeTakeFirstOrThrow(),
      db.selectFrom('cutter_events').select(['kind', 'from_status', 'to_status', 'machine_id', 'note']).where('cutter_id', '=', cutterId).orderBy('id').execute(),
      db.selectFrom('regrind_batch_items').selectAll().where('cutter_id', '=', cutterId).orderBy('id').execute(),
    ])
    return { cutter, events, items }
  } finally {
    await db.destroy()
  }
}
