// Insights: the roll-ups of the cut logs kept by a trigger, and adopted wear factors.
import type { ColumnType, Generated } from 'kysely'

// Written only by the trigger on cut_logs and by rebuild_cut_log_roll_ups(); read here.
type ByTrigger<T> = ColumnType<T, never, never>

export interface CutLogDailyTable {
  shop_id: ByTrigger<number>
  day: ByTrigger<string>
  material_id: ByTrigger<number>
  machine_id: ByTrigger<number | null>
  operator_id: ByTrigger<number | null>
  type_id: ByTrigger<number>
  logs: ByTrigger<number>
  minutes: ByTrigger<number>
  new_lives: ByTrigger<number>
  clean: ByTrigger<number>
  melted: ByTrigger<number>
  chip_out: ByTrigger<number>
  fuzzy: ByTrigger<number>
  broken: ByTrigger<number>
}

/** One row per sharp life of a cutter (its regrind count), the minutes by material inside. */
export interface CutSharpLivesTable {
  shop_id: ByTrigger<number>
  cutter_id: ByTrigger<number>
  regrind_count: ByTrigger<number>
  logs: ByTrigger<number>
  minutes: ByTrigger<number>
  sharp_share: ByTrigger<number>
  /** Material id (as text) → minutes. */
  material_minutes: ByTrigger<Record<string, number>>
  last_cut_at: ByTrigger<Date>
}

/** Cleanup minutes per part by UTC day, cutter type and material, from the logs that gave them
 *  (trigger cut_logs_roll_up_cleanup; rebuild_cut_cleanup_roll_up()). */
export interface CutCleanupDailyTable {
  shop_id: ByTrigger<number>
  day: ByTrigger<string>
  type_id: ByTrigger<number>
  material_id: ByTrigger<number>
  /** Logs that gave cleanup minutes. */
  logs: ByTrigger<number>
  /** Their cleanup minutes per part, summed. */
  minutes: ByTrigger<number>
}

export interface WearFactorAdoptionsTable {
  id: Generated<number>
  shop_id: number
  material_id: number
  from_factor: number
  to_factor: number
  lives: number
  from_date: string
  to_date: string
  adopted_by: number | null
  adopted_at: ColumnType<Date, Date | string | undefined, never>
}
