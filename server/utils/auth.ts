// Who is asking, and may they? Every route calls requireUser or requireRole first; the role
// and the account's standing are read from the database on each request, so a demoted or
// removed user loses access at once, whatever their cookie says.
import type { H3Event } from 'h3'
import { ROLE_LABELS, roleAtLeast, type Role } from '#shared/kerf/roles'

export interface SessionUser {
  id: number
  shopId: number
  role: Role
  name: string
  email: string
  lengthUnit: 'mm' | 'in'
}

export async function requireUser(event: H3Event): Promise<SessionUser> {
  const session = await getUserSession(event)
  const sessionUser = session.user
  if (!sessionUser) {
    throw createError({ statusCode: 401, statusMessage: 'Sign in to continue.' })
  }
  const row = await useDb()
    .selectFrom('users')
    .select(['id', 'shop_id', 'role', 'name', 'email', 'length_unit', 'active'])
    .where('id', '=', sessionUser.id)
    .where('shop_id', '=', sessionUser.shopId)
    .executeTakeFirst()
  if (!row || !row.active) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Your account is no longer active. Ask the shop owner.' })
  }
  return { id: row.id, shopId: row.shop_id, role: row.role, name: row.name, email: row.email, lengthUnit: row.length_unit }
}

export async function requireRole(event: H3Event, needed: Role): Promise<SessionUser> {
  const user = await requireUser(event)
  if (!roleAtLeast(user.role, needed)) {
    throw createError({
      statusCode: 403,
      statusMessage: `This needs the ${ROLE_LABELS[needed].toLowerCase()} role or higher; you are signed in as ${ROLE_LABELS[user.role].toLowerCase()}.`,
    })
  }
  return user
}

export async function startSession(event: H3Event, user: { id: number, shopId: number, name: string, role: Role }) {
  await replaceUserSession(event, { user: { id: user.id, shopId: user.shopId, name: user.name, role: user.role }, loggedInAt: Date.now() })
}

/** A 404 for a record that is not in the caller's shop (or not at all): never a 403, which would leak that it exists. */
export function notFound(what: string): never {
  throw createError({ statusCode: 404, statusMessage: `No such ${what} in your shop.` })
}
