// The spindle room: machines, materials, cutters and what happens to them.
import type { ColumnType, Generated } from 'kysely'
import type { CutterStatus } from '../../../shared/kerf/status'
import type { MaterialFamily } from '../../../shared/kerf/materials'
import type { CutOutcome } from '../../../shared/kerf/spindle'
import type { CutterEventKind } from '../../../shared/kerf/history-words'

// The value lists live once in shared/kerf, where the pages and the CHECK-matching schemas use them.
export type { CutterStatus } from '../../../shared/kerf/status'
export type { MaterialFamily } from '../../../shared/kerf/materials'
export type { CutOutcome } from '../../../shared/kerf/spindle'
export type { CutterEventKind } from '../../../shared/kerf/history-words'
type Stamp = ColumnType<Date, Date | string | undefined, Date | string>

export interface MachinesTable {
  id: Generated<number>
  shop_id: number
  name: string
  description: Generated<string>
  min_rpm: number
  max_rpm: number
  /** Tool-changer pockets; 0 is a manual collet holding one cutter at a time. */
  pockets: Generated<number>
  spindle_power_kw: number | null
  bed_x_mm: number | null
  bed_y_mm: number | null
  active: Generated<boolean>
  retired_at: Date | null
  /** For the program reader's time estimates. */
  acceleration_mm_s2: Generated<number>
  rapid_mm_per_min: Generated<number>
  created_at: Stamp
}

export interface MaterialsTable {
  id: Generated<number>
  shop_id: number
  name: string
  family: MaterialFamily
  wear_factor: number
  common: Generated<boolean>
  active: Generated<boolean>
  retired_at: Date | null
  created_at: Stamp
}

/** The shop's chip-load table for feeds and speeds: one row per material family and diameter band. */
export interface ChipLoadsTable {
  id: Generated<number>
  shop_id: number
  family: MaterialFamily
  diameter_min_mm: number
  diameter_max_mm: number
  chip_load_min_mm: number
  chip_load_max_mm: number
  surface_speed_m_per_min: number | null
  plunge_fraction: number | null
  depth_per_pass_factor: number | null
  source: string
  updated_by: number | null
  updated_at: Stamp
}

export interface CuttersTable {
  id: Generated<number>
  shop_id: number
  type_id: number
  code: string
  status: Generated<CutterStatus>
  machine_id: number | null
  /** The tool-changer pocket while loaded in a machine with pockets. */
  pocket: number | null
  diameter_mm: number
  regrind_count: Generated<number>
  life_scale: Generated<number>
  life_used: Generated<number>
  minutes_this_life: Generated<number>
  minutes_total: Generated<number>
  flagged: 'dull' | 'broken' | null
  flagged_at: Date | null
  retired_reason: 'worn' | 'broken' | 'undersize' | 'other' | null
  order_line_id: number | null
  received_at: Stamp
  updated_at: Stamp
}

export interface CutLogsTable {
  id: Generated<string>
  shop_id: number
  cutter_id: number
  machine_id: number | null
  operator_id: number | null
  material_id: number
  minutes: number
  wear_factor: number
  life_added: number
  regrind_count: Generated<number>
  rpm: number | null
  feed_mm_per_min: number | null
  outcome: CutOutcome
  /** Hand-finishing minutes per part that the edge cost; null when not given. */
  cleanup_minutes_per_part: number | null
  note: Generated<string>
  idempotency_key: string
  cut_at: Stamp
  created_at: Stamp
  /** A voided log stays in the history and counts nowhere. */
  voided_at: Date | null
}

/** Each correction or void of a cut log: who, why, and the log's figures before and after. */
export interface CutLogChangesTable {
  id: Generated<string>
  shop_id: number
  cut_log_id: string
  cutter_id: number
  kind: 'corrected' | 'voided'
  actor_id: number | null
  reason: string
  before: unknown
  after: unknown
  created_at: Generated<Date>
}

export interface CutterEventsTable {
  id: Generated<string>
  shop_id: number
  cutter_id: number
  kind: CutterEventKind
  from_status: CutterStatus | null
  to_status: CutterStatus | null
  machine_id: number | null
  actor_id: number | null
  photo_id: number | null
  note: Generated<string>
  /** The phone's key for a load or return, so that a retry is recognised (null for other events). */
  idempotency_key: Generated<string | null>
  created_at: Stamp
}

export interface UploadsTable {
  id: Generated<number>
  shop_id: number
  storage_key: string
  kind: 'photo' | 'csv'
  content_type: string
  size_bytes: number
  original_name: string | null
  uploaded_by: number | null
  created_at: Stamp
}
