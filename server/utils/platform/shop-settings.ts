// The shop's settings as the settings page sees them.
import { sql } from 'kysely'
import type { Queryable } from '../../db/connect'
import { badField } from './validation'

export async function shopSettings(db: Queryable, shopId: number) {
  const s = await db.selectFrom('shops').selectAll().where('id', '=', shopId).executeTakeFirstOrThrow()
  return {
    id: s.id,
    name: s.name,
    timeZone: s.time_zone,
    reportTime: s.report_time.slice(0, 5),
    reportRecipients: s.report_recipients,
    dailyAllClear: s.daily_all_clear,
    lifeThreshold: s.life_threshold,
    regrindLifeFraction: s.regrind_life_fraction,
    orderCostCents: s.order_cost_cents,
    holdingRate: s.holding_rate,
    shiftMinutes: s.shift_minutes,
    labourRateCentsPerHour: s.labour_rate_cents_per_hour,
    address: s.address,
    phone: s.phone,
    replyEmail: s.reply_email,
    currency: s.currency,
  }
}
export type ShopSettings = Awaited<ReturnType<typeof shopSettings>>

/** The shop's IANA time zone: its days (insights, reports, exports) run from its local midnight. */
export async function shopTimeZone(db: Queryable, shopId: number): Promise<string> {
  const s = await db.selectFrom('shops').select('time_zone').where('id', '=', shopId).executeTakeFirstOrThrow()
  return s.time_zone
}

/**
 * Refuses a time zone the database does not know, naming the field: the shop's days are worked
 * out in PostgreSQL, so a name that only the browser's tables hold would make every logged cut fail.
 */
export async function assertKnownTimeZone(db: Queryable, timeZone: string): Promise<void> {
  const known = await sql`select 1 from pg_timezone_names where name = ${timeZone}`.execute(db)
  if (!known.rows.length) badField('timeZone', 'is not a time zone this server knows (for example America/Chicago)')
}
