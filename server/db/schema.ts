// The one Database type, composed from a file of tables per room.
import type { AuthTokensTable, LoginAttemptsTable, ShopDevicesTable, ShopMailsTable, ShopsTable, UserSessionsTable, UsersTable } from './tables/shop'
import type {
  ChipLoadsTable, CutLogChangesTable, CutLogsTable, CutterEventsTable, CuttersTable, MachinesTable, MaterialsTable, UploadsTable,
} from './tables/spindle'
import type {
  CutterTypesTable, PurchaseOrderLinesTable, PurchaseOrdersTable, RegrindBatchItemsTable, RegrindBatchesTable,
  SuppliersTable, ToolingReportsTable,
} from './tables/crib'
import type { CutCleanupDailyTable, CutLogDailyTable, CutSharpLivesTable, WearFactorAdoptionsTable } from './tables/insights'
import type { MachineToolPocketsTable, NcProgramsTable, NcRunLogsTable, NcRunsTable } from './tables/programs'

export type * from './tables/shop'
export type * from './tables/spindle'
export type * from './tables/crib'
export type * from './tables/insights'
export type * from './tables/programs'

export interface Database {
  shops: ShopsTable
  users: UsersTable
  user_sessions: UserSessionsTable
  shop_devices: ShopDevicesTable
  shop_mails: ShopMailsTable
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
  cut_cleanup_daily: CutCleanupDailyTable
  wear_factor_adoptions: WearFactorAdoptionsTable
  machine_tool_pockets: MachineToolPocketsTable
  nc_programs: NcProgramsTable
  nc_runs: NcRunsTable
  nc_run_logs: NcRunLogsTable
}
