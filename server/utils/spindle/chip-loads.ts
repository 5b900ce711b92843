// The shop's chip-load table as the routes see it, and the starting rows a new shop gets.
// Imported by path from the demo seed too, so nothing here leans on Nitro's auto-imports.
import type { Insertable } from 'kysely'
import { STARTING_CHIP_LOADS, bandLabel, type ChipLoadBand } from '../../../shared/kerf/chip-loads'
import type { MaterialFamily } from '../../../shared/kerf/materials'
import type { Queryable } from '../../db/connect'
import type { ChipLoadsTable } from '../../db/schema'

/** The starting table for one shop, ready to insert. */
export function startingChipLoadRows(shopId: number): Insertable<ChipLoadsTable>[] {
  return STARTING_CHIP_LOADS.map((b) => ({
    shop_id: shopId, family: b.family, diameter_min_mm: b.diameterMinMm, diameter_max_mm: b.diameterMaxMm,
    chip_load_min_mm: b.chipLoadMinMm, chip_load_max_mm: b.chipLoadMaxMm, surface_speed_m_per_min: b.surfaceSpeedMPerMin,
    plunge_fraction: b.plungeFraction, depth_per_pass_factor: b.depthPerPassFactor, source: b.source,
  }))
}

export interface ChipLoadRow extends ChipLoadBand { id: number, label: string, updatedAt: Date }

/** The shop's rows (of one family, when given), by family and then diameter. */
export async function chipLoadRows(db: Queryable, shopId: number, family?: MaterialFamily): Promise<ChipLoadRow[]> {
  let query = db.selectFrom('chip_loads')
    .select(['id', 'family', 'diameter_min_mm', 'diameter_max_mm', 'chip_load_min_mm', 'chip_load_max_mm', 'surface_speed_m_per_min',
      'plunge_fraction', 'depth_per_pass_factor', 'source', 'updated_at'])
    .where('shop_id', '=', shopId)
  if (family) query = query.where('family', '=', family)
  const rows = await query.orderBy('family').orderBy('diameter_min_mm').execute()
  return rows.map((r) => ({
    id: r.id,
    family: r.family,
    diameterMinMm: r.diameter_min_mm,
    diameterMaxMm: r.diameter_max_mm,
    label: bandLabel({ diameterMinMm: r.diameter_min_mm, diameterMaxMm: r.diameter_max_mm }),
    chipLoadMinMm: r.chip_load_min_mm,
    chipLoadMaxMm: r.chip_load_max_mm,
    surfaceSpeedMPerMin: r.surface_speed_m_per_min,
    plungeFraction: r.plunge_fraction,
    depthPerPassFactor: r.depth_per_pass_factor,
    source: r.source,
    updatedAt: r.updated_at,
  }))
}
