// NC programs, their runs, and the tool changer's tool-number map (the spindle room).
import type { ColumnType, Generated } from 'kysely'
import type { NcProblem, NcTool } from '../../../shared/kerf/nc/read'

type Stamp = ColumnType<Date, Date | string | undefined, Date | string>
type Json<T> = ColumnType<T, string, string>
export interface ToolEstimate { tool: number, estimatedMinutes: number, rapidMinutes: number }

export interface MachineToolPocketsTable {
  shop_id: number
  machine_id: number
  tool: number
  pocket: number
}

export interface NcProgramsTable {
  id: Generated<number>
  shop_id: number
  name: string
  size_bytes: number
  storage_key: string
  units: 'mm' | 'inch'
  spindle_tool: number | null
  /** The reading at the default acceleration and rapid rate, per tool. */
  tools: Json<NcTool[]>
  /** Per machine setting ('acceleration/rapid'): each tool's estimated and rapid minutes. */
  estimates: ColumnType<Record<string, ToolEstimate[]>, string | undefined, string>
  problems: ColumnType<NcProblem[], string | undefined, string>
  tool_count: number
  total_minutes: number
  line_count: number
  uploaded_by: number | null
  created_at: Stamp
}

export interface NcRunsTable {
  id: Generated<number>
  shop_id: number
  program_id: number
  machine_id: number
  material_id: number
  repeats: number
  job_ref: Generated<string>
  operator_id: number | null
  idempotency_key: string
  created_at: Stamp
}

export interface NcRunLogsTable {
  shop_id: number
  run_id: number
  tool: number
  cut_log_id: string
}
