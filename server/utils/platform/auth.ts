// Who is asking, and may they? Every route calls requireUser or requireRole first; the role
// and the account's standing are read from the database on each request, so a demoted or
// removed user loses access at once, whatever their cookie says.
//
// Sessions end: the sealed cookie names a row of user_sessions, read with the person on every
// request (one prepared statement, as before). startSession is the one way to sign someone in,
// endSession signs one session out, and endSessions(db, userId) ends all of a person's sessions
// on every instance at once: call it whenever a password is changed or reset, a role changes,
// an account is switched off, or someone asks to be signed out everywhere.
import type { H3Event } from 'h3'
import { sql } from 'kysely'
import { ROLE_LABELS, roleAtLeast, type Role } from '#shared/kerf/roles'
import { PREPARED, type Queryable } from '../../db/connect'
import { reusableQuery } from '../../db/reusable'

export interface SessionUser {
  id: number
  shopId: number
  role: Role
  name: string
  /** Null for an operator added by name only, who signs in with a PIN on a shop device. */
  email: string | null
  lengthUnit: 'mm' | 'in'
}

// Opening the sealed session cookie (two key derivations and a decryption) was the largest
// single cost of an ordinary request, and a browser sends the same cookie on every request, so
// what it holds is kept for a minute (never past the session's own end), keyed by the sealed
// value itself. Only the ids are kept, never whether the session still holds: the person, their
// standing and their session row are read afresh below, so ending a session on one instance ends
// it on all of them at the next request.
const OPENED_TTL_MS = 60_000
const OPENED_MAX = 10_000
interface OpenedSession { id: number, shopId: number, sid: string }
const opened = new Map<string, { session: OpenedSession | undefined, until: number }>()
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/

function openedOf(session: { user?: { id: number, shopId: number }, secure?: { sid?: string } }): OpenedSession | undefined {
  const sid = session.secure?.sid
  // A cookie sealed before sessions had rows names none: it is over.
  if (!session.user || typeof sid !== 'string' || !UUID.test(sid)) return undefined
  return { id: session.user.id, shopId: session.user.shopId, sid }
}

async function openedSessionOf(event: H3Event): Promise<OpenedSession | undefined> {
  // Without the event: the per-request copy of the config re-reads the environment (costly).
  const { name = 'nuxt-session', maxAge } = useRuntimeConfig().session
  const sealed = getCookie(event, name)
  // h3 also accepts the session in a header, which takes precedence: leave that case to it.
  if (!sealed || getRequestHeader(event, `x-${name.toLowerCase()}-session`)) return openedOf(await getUserSession(event))
  const now = Date.now()
  const hit = opened.get(sealed)
  if (hit && hit.until > now) return hit.session
  const session = openedOf(await getUserSession(event))
  if (session) {
    const createdAt = (event.context.sessions?.[name] as { createdAt?: number } | undefined)?.createdAt ?? 0
    if (opened.size >= OPENED_MAX) opened.delete(opened.keys().next().value!)
    opened.set(sealed, { session, until: Math.min(now + OPENED_TTL_MS, maxAge ? createdAt + maxAge * 1000 : Infinity) })
  }
  return session
}

/** The person with their session row and its device, if the session still holds: every request's read. */
const readSessionUser = reusableQuery((db, v: { userId: number, shopId: number, sid: string }) => db
  .selectFrom('users as u')
  .leftJoin('user_sessions as s', (j) => j.onRef('s.user_id', '=', 'u.id').on('s.id', '=', v.sid).on('s.expires_at', '>', sql<Date>`now()`))
  .leftJoin('shop_devices as d', (j) => j.onRef('d.id', '=', 's.device_id').on('d.revoked_at', 'is', null))
  .select(['u.id', 'u.shop_id', 'u.role', 'u.name', 'u.email', 'u.length_unit', 'u.active', 's.id as sid', 's.device_id', 'd.token_hash as device_hash'])
  .where('u.id', '=', v.userId)
  .where('u.shop_id', '=', v.shopId)
  .modifyEnd(PREPARED))

export async function requireUser(event: H3Event): Promise<SessionUser> {
  const session = await openedSessionOf(event)
  if (!session) {
    throw createError({ statusCode: 401, statusMessage: 'Sign in to continue.' })
  }
  const { rows: [row] } = await readSessionUser(useDb(), { userId: session.id, shopId: session.shopId, sid: session.sid })
  if (!row || !row.active || !row.sid) {
    await clearUserSession(event)
    throw createError({
      statusCode: 401,
      statusMessage: row && !row.active ? 'Your account is no longer active. Ask the shop owner.' : 'Your session has ended. Sign in again.',
    })
  }
  // A PIN sign-in holds only on the shop device it was made on, and only while that device is enrolled.
  if (row.device_id !== null && !deviceTokenMatches(event, row.device_hash)) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'A PIN sign-in works only on the shop device it was made on. Sign in again.' })
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

/**
 * Signs a person in on this browser: a new session row, and the sealed cookie naming it. Every
 * sign-in (password, reset link, invitation, PIN on a shop device, any new way in) goes through
 * here. A session this browser held before ends, and the person's expired rows are cleared away.
 * A PIN sign-in names its device, whose revocation ends the session.
 */
export async function startSession(event: H3Event, user: { id: number, shopId: number, name: string, role: Role }, opts: { deviceId?: number } = {}) {
  const db = useDb()
  const previous = openedOf(await getUserSession(event))
  const maxAge = Number(useRuntimeConfig().session.maxAge) || 60 * 60 * 24 * 14
  const row = await db.insertInto('user_sessions')
    .values({ user_id: user.id, expires_at: new Date(Date.now() + maxAge * 1000), device_id: opts.deviceId ?? null })
    .returning('id').executeTakeFirstOrThrow()
  await db.deleteFrom('user_sessions')
    .where('user_id', '=', user.id)
    .where((eb) => eb.or([eb('expires_at', '<=', sql<Date>`now()`), ...(previous ? [eb('id', '=', previous.sid)] : [])]))
    .execute()
  await replaceUserSession(event, {
    user: { id: user.id, shopId: user.shopId, name: user.name, role: user.role },
    secure: { sid: row.id },
    loggedInAt: Date.now(),
  })
}

/** Signs this browser's session out (its row goes, so a copy of the cookie stops working too). */
export async function endSession(event: H3Event) {
  const session = openedOf(await getUserSession(event))
  if (session) await useDb().deleteFrom('user_sessions').where('id', '=', session.sid).execute()
  await clearUserSession(event)
}

/** Ends every session of one person, on every instance, from their next request on. */
export async function endSessions(db: Queryable, userId: number): Promise<void> {
  await db.deleteFrom('user_sessions').where('user_id', '=', userId).execute()
}

/** Whether the session a cookie names still holds (for the session route the client polls). */
export async function sessionHolds(session: { user?: { id: number, shopId: number }, secure?: { sid?: string } }): Promise<boolean> {
  const s = openedOf(session)
  if (!s) return false
  const row = await useDb().selectFrom('user_sessions as s').innerJoin('users as u', 'u.id', 's.user_id')
    .select('s.id').where('s.id', '=', s.sid).where('u.id', '=', s.id).where('u.shop_id', '=', s.shopId)
    .where('u.active', '=', true).where('s.expires_at', '>', sql<Date>`now()`)
    .executeTakeFirst()
  return Boolean(row)
}

/** A 404 for a record that is not in the caller's shop (or not at all): never a 403, which would leak that it exists. */
export function notFound(what: string): never {
  throw createError({ statusCode: 404, statusMessage: `No such ${what} in your shop.` })
}
