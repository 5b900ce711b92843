// The signed-in user as the client sees it (GET /api/me and every sign-in route answer this).
import type { Queryable } from '../../db/connect'

export async function loadMe(db: Queryable, userId: number) {
  const row = await db.selectFrom('users as u')
    .innerJoin('shops as s', 's.id', 'u.shop_id')
    .select(['u.id', 'u.name', 'u.email', 'u.role', 'u.length_unit', 'u.email_confirmed_at', 's.id as shopId', 's.name as shopName', 's.currency', 's.time_zone'])
    .where('u.id', '=', userId)
    .executeTakeFirstOrThrow()
  return {
    id: row.id,
    name: row.name,
    email: row.email,
    role: row.role,
    lengthUnit: row.length_unit,
    emailConfirmed: row.email_confirmed_at !== null,
    shop: { id: row.shopId, name: row.shopName, currency: row.currency, timeZone: row.time_zone },
  }
}
export type Me = Awaited<ReturnType<typeof loadMe>>
