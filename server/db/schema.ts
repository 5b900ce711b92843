// The one Database type, composed from a file of tables per room.
import type { AuthTokensTable, LoginAttemptsTable, ShopsTable, UsersTable } from './tables/shop'
import type {
  ChipLoadsTable, CutLogChangesTable, CutLogsTable, CutterEventsTable, CuttersTable, MachinesTable, MaterialsTable, UploadsTable,
} from './tables/spindle'
import type {
  CutterTypesTable, PurchaseOrderLinesTable, PurchaseOrdersTable, RegrindBatchItemsTable, RegrindBatchesTable,
  SuppliersTable, ToolingReportsTable,
} from './tables/crib'
import type { CutLogDailyTable, CutSharpLivesTable, WearFactorAdoptionsTable } from './tables/insights'

export type * from './tables/shop'
export type * from './tables/spindle'
export type * from './tables/crib'
export type * from './tables/insights'

export interface Database {
  shops: ShopsTable
  users: UsersTable
  auth_tokens: AuthTokensTable
  login_attempts: LoginAttemptsTable
  machines: MachinesTable
  materials: MaterialsTable
  chip_loads: ChipLoadsTable
  suppliers: SuppliersTable
  cutter_types: CutterTypesTable
  purchase_orders: PurchaseOrdersTable
  purchase_order_lines: PurchaseOrderLinesTable
  cutters: CuttersTable
  uploads: UploadsTable
  cut_logs: CutLogsTable
  cut_log_changes: CutLogChangesTable
  cutter_events: CutterEventsTable
  regrind_batches: RegrindBatchesTable
  regrind_batch_items: RegrindBatchItemsTable
  tooling_reports: ToolingReportsTable
  cut_log_daily: CutLogDailyTable
  cut_sharp_lives: CutSharpLivesTable
  wear_factor_adoptions: WearFactorAdoptionsTable
}
