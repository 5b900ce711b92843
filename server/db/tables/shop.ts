// Shops and the people in them.
import type { ColumnType, Generated } from 'kysely'
import type { Role } from '../../../shared/kerf/roles'
import type { LengthUnit } from '../../../shared/kerf/units'
import type { Currency } from '../../../shared/kerf/money'

export type { LengthUnit, Role }
type CreatedAt = ColumnType<Date, Date | string | undefined, never>

export interface ShopsTable {
  id: Generated<number>
  name: string
  time_zone: Generated<string>
  report_time: Generated<string>
  report_recipients: string[] | null
  daily_all_clear: Generated<boolean>
  life_threshold: Generated<number>
  /** Minutes in the shop's shift: the cut form asks before logging more in one go. */
  shift_minutes: Generated<number>
  regrind_life_fraction: Generated<number>
  order_cost_cents: Generated<number>
  holding_rate: Generated<number>
  /** Integer cents per hour of hand-finishing, for the cost of cleanup minutes; null until set. */
  labour_rate_cents_per_hour: number | null
  review_interval_days: Generated<number>
  /** Postal address, lines separated by newlines; printed on orders and regrind batches. */
  address: Generated<string>
  phone: string | null
  /** Where suppliers reply (Reply-To of the shop's orders and batches). */
  reply_email: string | null
  currency: Generated<Currency>
  last_order_number: Generated<number>
  last_batch_number: Generated<number>
  created_at: CreatedAt
}

export interface UsersTable {
  id: Generated<number>
  shop_id: number
  /** Null for an operator added by name only (they sign in with a PIN on a shop device). */
  email: string | null
  name: string
  role: Role
  password_hash: string | null
  /** An operator's PIN for the shop's enrolled devices, hashed as passwords are. */
  pin_hash: string | null
  length_unit: Generated<LengthUnit>
  active: Generated<boolean>
  created_at: CreatedAt
  last_login_at: Date | null
  email_confirmed_at: Date | null
}

/** One session: a sealed cookie names its row, and the session holds while the row does. */
export interface UserSessionsTable {
  id: Generated<string>
  user_id: number
  created_at: CreatedAt
  expires_at: Date
  /** The shop device a PIN sign-in happened on: revoking the device ends the session. */
  device_id: number | null
}

/** A browser enrolled as one of the shop's devices; the cookie holds the token, this row its SHA-256. */
export interface ShopDevicesTable {
  id: Generated<number>
  shop_id: number
  name: string
  token_hash: string
  enrolled_by: number | null
  created_at: CreatedAt
  last_used_at: Date | null
  revoked_at: Date | null
  revoked_by: number | null
}

/** A mail a shop sent to others, counted for the hourly limit. */
export interface ShopMailsTable {
  id: Generated<string>
  shop_id: number
  kind: string
  recipients: number
  sent_at: Generated<Date>
}

export interface AuthTokensTable {
  id: Generated<number>
  shop_id: number
  user_id: number
  purpose: 'invite' | 'reset' | 'confirm'
  token_hash: string
  created_by: number | null
  created_at: CreatedAt
  expires_at: Date
  used_at: Date | null
}

export interface LoginAttemptsTable {
  id: Generated<string>
  email: string
  address: string
  succeeded: boolean
  attempted_at: Generated<Date>
}
