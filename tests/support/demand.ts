// Cutting history for a test shop, written straight into cut_logs (the insert trigger keeps the
// insights roll-ups right): steady daily use of one cutter in one material, ending today.
import { appDb } from './db'

const DAY = 86_400_000

export interface SteadyUse {
  shopId: number
  cutterId: number
  material: string
  days: number
  minutesPerDay: number
  ratedLifeMinutes: number
  machineId?: number
  operatorId?: number
}

/** One clean log a day for `days` days; returns the material's id. */
export async function addSteadyUse(use: SteadyUse): Promise<number> {
  const db = appDb()
  try {
    const material = await db.selectFrom('materials').select(['id', 'wear_factor'])
      .where('shop_id', '=', use.shopId).where('name', '=', use.material).executeTakeFirstOrThrow()
    const now = Date.now()
    await db.insertInto('cut_logs').values(Array.from({ length: use.days }, (_, k) => ({
      shop_id: use.shopId, cutter_id: use.cutterId, material_id: material.id, machine_id: use.machineId ?? null,
      operator_id: use.operatorId ?? null, minutes: use.minutesPerDay, wear_factor: material.wear_factor,
      life_added: use.minutesPerDay * material.wear_factor / use.ratedLifeMinutes, outcome: 'clean' as const,
      idempotency_key: `steady-${use.shopId}-${use.cutterId}-${material.id}-${k}`, cut_at: new Date(now - k * DAY - 1000),
    }))).execute()
    return material.id
  } finally {
    await db.destroy()
  }
}
