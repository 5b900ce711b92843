// The crib: suppliers, the catalogue of cutter types, purchase orders and regrind batches.
import type { ColumnType, Generated } from 'kysely'
import type { Helix, Profile, ToolMaterial } from '../../../shared/kerf/geometry'

export type { Helix, Profile, ToolMaterial }
// A timestamp with a default: optional on insert, a Date when read.
type Stamp = ColumnType<Date, Date | string | undefined, Date | string>

export interface SuppliersTable {
  id: Generated<number>
  shop_id: number
  name: string
  email: string | null
  phone: string | null
  lead_time_days: Generated<number>
  regrind_turnaround_days: Generated<number>
  note: Generated<string>
  active: Generated<boolean>
  created_at: Stamp
}

export interface CutterTypesTable {
  id: Generated<number>
  shop_id: number
  supplier_id: number | null
  supplier_part_number: string | null
  name: string
  profile: Profile
  v_angle_deg: number | null
  helix: Helix
  tool_material: Generated<ToolMaterial>
  flutes: number
  cutting_diameter_mm: number
  shank_diameter_mm: number
  cutting_length_mm: number
  overall_length_mm: number
  rated_life_minutes: number
  max_regrinds: Generated<number>
  regrind_diameter_loss_mm: Generated<number>
  min_usable_diameter_mm: number
  unit_cost_cents: number
  regrind_cost_cents: Generated<number>
  pack_size: Generated<number>
  service_level: Generated<number>
  lead_time_days_override: number | null
  min_on_hand: number | null
  max_on_hand: number | null
  spares_per_machine: number | null
  do_not_reorder: Generated<boolean>
  /** The longest minutes of one counting log of the type, kept by a trigger on cut_logs; null before the first. */
  longest_cut_minutes: Generated<number | null>
  active: Generated<boolean>
  created_at: Stamp
}

export interface PurchaseOrdersTable {
  id: Generated<number>
  shop_id: number
  supplier_id: number | null
  /** Counted per shop by a trigger: the shop's first order is 1. */
  number: Generated<number>
  /** The shop's address as it was when the order was sent. */
  ship_to: string | null
  status: Generated<'draft' | 'sent' | 'partly_received' | 'received' | 'cancelled'>
  note: Generated<string>
  created_by: number | null
  created_at: Stamp
  sent_at: Date | null
  received_at: Date | null
}

export interface PurchaseOrderLinesTable {
  id: Generated<number>
  shop_id: number
  order_id: number
  type_id: number
  quantity: number
  received_quantity: Generated<number>
  unit_cost_cents: number
}

export interface RegrindBatchesTable {
  id: Generated<number>
  shop_id: number
  supplier_id: number | null
  /** Counted per shop by a trigger: the shop's first batch is 1. */
  number: Generated<number>
  /** The shop's address as it was when the batch was sent. */
  ship_to: string | null
  status: Generated<'draft' | 'sent' | 'received' | 'cancelled'>
  note: Generated<string>
  created_by: number | null
  created_at: Stamp
  sent_at: Date | null
  received_at: Date | null
}

export interface RegrindBatchItemsTable {
  id: Generated<number>
  shop_id: number
  batch_id: number
  cutter_id: number
  diameter_before_mm: number
  diameter_after_mm: number | null
  result: 'reground' | 'retired' | null
  cost_cents: Generated<number>
  received_at: Date | null
  /** The regrinder's reason when it scrapped the bit instead of resharpening it. */
  scrap_reason: string | null
}

export interface ToolingReportsTable {
  id: Generated<number>
  shop_id: number
  report_date: string
  status: 'sending' | 'sent' | 'failed' | 'nothing_to_report'
  recipients: Generated<string[]>
  subject: Generated<string>
  body_text: Generated<string>
  body_html: Generated<string>
  attempts: Generated<number>
  error: string | null
  manual: Generated<boolean>
  created_at: Stamp
  sent_at: Date | null
}
