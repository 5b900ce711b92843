// Who is asking, and may they? Every route calls requireUser or requireRole first; the role
// and the account's standing are read from the database on each request, so a demoted or
// removed user loses access at once, whatever their cookie says.
import type { H3Event } from 'h3'
import { ROLE_LABELS, roleAtLeast, type Role } from '#shared/kerf/roles'
import { PREPARED } from '../../db/connect'

export interface SessionUser {
  id: number
  shopId: number
  role: Role
  name: string
  email: string
  lengthUnit: 'mm' | 'in'
}

// Opening the sealed session cookie (two key derivations and a decryption) was the largest
// single cost of an ordinary request, and a browser sends the same cookie on every request, so
// what it holds is kept for a minute (never past the session's own end), keyed by the sealed
// value itself. Only the ids are kept: the person's role and standing are read afresh below.
const OPENED_TTL_MS = 60_000
const OPENED_MAX = 10_000
const opened = new Map<string, { user: { id: number, shopId: number }, until: number }>()

async function sessionUserOf(event: H3Event): Promise<{ id: number, shopId: number } | undefined> {
  // Without the event: the per-request copy of the config re-reads the environment (costly).
  const { name = 'nuxt-session', maxAge } = useRuntimeConfig().session
  const sealed = getCookie(event, name)
  // h3 also accepts the session in a header, which takes precedence: leave that case to it.
  if (!sealed || getRequestHeader(event, `x-${name.toLowerCase()}-session`)) return (await getUserSession(event)).user
  const now = Date.now()
  const hit = opened.get(sealed)
  if (hit && hit.until > now) return hit.user
  const user = (await getUserSession(event)).user
  if (user) {
    const createdAt = (event.context.sessions?.[name] as { createdAt?: number } | undefined)?.createdAt ?? 0
    if (opened.size >= OPENED_MAX) opened.delete(opened.keys().next().value!)
    opened.set(sealed, { user: { id: user.id, shopId: user.shopId }, until: Math.min(now + OPENED_TTL_MS, maxAge ? createdAt + maxAge * 1000 : Infinity) })
  }
  return user
}

export async function requireUser(event: H3Event): Promise<SessionUser> {
  const sessionUser = await sessionUserOf(event)
  if (!sessionUser) {
    throw createError({ statusCode: 401, statusMessage: 'Sign in to continue.' })
  }
  const row = await useDb()
    .selectFrom('users')
    .select(['id', 'shop_id', 'role', 'name', 'email', 'length_unit', 'active'])
    .where('id', '=', sessionUser.id)
    .where('shop_id', '=', sessionUser.shopId)
    .modifyEnd(PREPARED)
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
