// Shop devices and PINs. A crib manager or owner enrols the browser they are on as one of the
// shop's devices: it keeps a random token in an HttpOnly cookie, the database only the token's
// SHA-256. On an enrolled device the sign-in page lists the shop's operators who have a PIN, and
// a name plus PIN signs in as that operator, for that shop, on that device only (requireUser
// checks the device cookie for a session that names a device). PIN tries are throttled per
// operator and per device; revoking a device ends every session started on it at once.
import { createHash, randomBytes, randomInt } from 'node:crypto'
import type { H3Event } from 'h3'
import { sql } from 'kysely'
import { isObviousPin } from '#shared/schemas/devices'
import type { Queryable } from '../../db/connect'
import type { SessionUser } from './auth'
import type { ThrottleRules } from './throttle'

export const DEVICE_COOKIE = 'kerfbook-device'
// Browsers keep a cookie at most 400 days; the device stays enrolled until it is revoked.
const DEVICE_COOKIE_DAYS = 400
const TOKEN_SHAPE = /^[\w-]{43}$/

// Four digits are few: five wrong tries lock one operator out of one device, ten lock them out
// of every device that has failed for them, and fifteen lock the device for everyone, each for
// the window (a quarter of an hour).
export const PIN_THROTTLE: ThrottleRules = {
  limits: { windowMinutes: 15, perAccount: 5, perAddress: 15, perAccountEverywhere: 10 },
  words: { account: 'this operator on this device', address: 'this device', advice: 'or ask the crib manager for a new PIN' },
}

const hashDeviceToken = (token: string) => createHash('sha256').update(token).digest('hex')

function deviceToken(event: H3Event): string | undefined {
  const token = getCookie(event, DEVICE_COOKIE)
  return token && TOKEN_SHAPE.test(token) ? token : undefined
}

/** Whether this request carries the device cookie whose hash is `hash` (null: no live device). */
export function deviceTokenMatches(event: H3Event, hash: string | null): boolean {
  const token = deviceToken(event)
  return Boolean(token && hash && hashDeviceToken(token) === hash)
}

/** The live device this browser is enrolled as, if any. */
export async function currentDevice(db: Queryable, event: H3Event) {
  const token = deviceToken(event)
  if (!token) return undefined
  return db.selectFrom('shop_devices as d').innerJoin('shops as s', 's.id', 'd.shop_id')
    .select(['d.id', 'd.shop_id as shopId', 'd.name', 's.name as shopName'])
    .where('d.token_hash', '=', hashDeviceToken(token)).where('d.revoked_at', 'is', null)
    .executeTakeFirst()
}

function setDeviceCookie(event: H3Event, token: string) {
  const secure = (useRuntimeConfig(event).session as { cookie?: { secure?: boolean | string } }).cookie?.secure
  setCookie(event, DEVICE_COOKIE, token, {
    httpOnly: true, sameSite: 'lax', secure: secure !== false && secure !== 'false', path: '/', maxAge: DEVICE_COOKIE_DAYS * 24 * 60 * 60,
  })
}

/** Ends a device: it can no longer sign anyone in, and the sessions started on it end now. */
async function endDevice(tx: Queryable, shopId: number, deviceId: number, by: number) {
  const ended = await tx.updateTable('shop_devices').set({ revoked_at: sql`now()`, revoked_by: by })
    .where('id', '=', deviceId).where('shop_id', '=', shopId).where('revoked_at', 'is', null)
    .returning(['id', 'name']).executeTakeFirst()
  await tx.deleteFrom('user_sessions').where('device_id', '=', deviceId).execute()
  return ended
}

/**
 * Enrols this browser as one of the shop's devices. A browser already enrolled (for this shop)
 * is enrolled afresh under the new name: its old credential ends, with the sessions made on it.
 */
export async function enrolDevice(event: H3Event, user: SessionUser, name: string) {
  const token = randomBytes(32).toString('base64url')
  const before = await currentDevice(useDb(), event)
  const device = await transaction(async (tx) => {
    if (before && before.shopId === user.shopId) await endDevice(tx, user.shopId, before.id, user.id)
    return tx.insertInto('shop_devices')
      .values({ shop_id: user.shopId, name, token_hash: hashDeviceToken(token), enrolled_by: user.id })
      .returning(['id', 'name', 'created_at as createdAt']).executeTakeFirstOrThrow()
  }).catch((err: unknown) => {
    if (isUniqueViolation(err, 'shop_devices_live_name_key')) {
      fieldError({ name: 'another device of the shop has this name' }, {
        status: 409, message: `Another device of the shop is called "${name}". Choose another name, or revoke that device first.`,
      })
    }
    throw err
  })
  setDeviceCookie(event, token)
  return device
}

/** The shop's live devices, newest first, and which one (if any) this browser is. */
export async function listDevices(db: Queryable, event: H3Event, shopId: number) {
  const [rows, here] = await Promise.all([
    db.selectFrom('shop_devices as d').leftJoin('users as u', 'u.id', 'd.enrolled_by')
      .select(['d.id', 'd.name', 'd.created_at as createdAt', 'd.last_used_at as lastUsedAt', 'u.name as enrolledBy'])
      .where('d.shop_id', '=', shopId).where('d.revoked_at', 'is', null)
      .orderBy('d.created_at', 'desc').orderBy('d.id', 'desc').execute(),
    currentDevice(db, event),
  ])
  return rows.map((d) => ({ ...d, thisBrowser: here?.id === d.id && here.shopId === shopId }))
}

/** Revokes one of the shop's devices now; its PIN sessions end with it. */
export async function revokeDevice(user: SessionUser, deviceId: number) {
  return transaction(async (tx) => {
    const device = await tx.selectFrom('shop_devices').select(['id', 'name', 'revoked_at'])
      .where('id', '=', deviceId).where('shop_id', '=', user.shopId).forUpdate().executeTakeFirst()
    if (!device) notFound('device')
    if (device.revoked_at) {
      throw createError({ statusCode: 409, statusMessage: `"${device.name}" was already revoked. Refresh the list of devices.` })
    }
    await endDevice(tx, user.shopId, device.id, user.id)
    return { id: device.id, name: device.name, revoked: true }
  })
}

/** The shop's operators as the devices page shows them: whether each has a PIN. */
export async function listOperators(db: Queryable, shopId: number) {
  const rows = await db.selectFrom('users')
    .select(['id', 'name', 'email', 'active', 'pin_hash', 'password_hash'])
    .where('shop_id', '=', shopId).where('role', '=', 'operator')
    .orderBy('active', 'desc').orderBy('name').orderBy('id').execute()
  return rows.map(({ pin_hash, password_hash, ...u }) => ({ ...u, hasPin: pin_hash !== null, hasPassword: password_hash !== null }))
}

/** A random PIN of six digits, never an obvious one. */
export function makePin(): string {
  for (;;) {
    const pin = String(randomInt(0, 1_000_000)).padStart(6, '0')
    if (!isObviousPin(pin)) return pin
  }
}

/** The shop's operator `userId`, locked for a change, or 404; 409 when they cannot have a PIN. */
async function operatorForPin(tx: Queryable, shopId: number, userId: number) {
  const person = await tx.selectFrom('users').select(['id', 'name', 'role', 'active'])
    .where('id', '=', userId).where('shop_id', '=', shopId).forUpdate().executeTakeFirst()
  if (!person) notFound('person')
  if (person.role !== 'operator') {
    throw createError({ statusCode: 409, statusMessage: `PINs are for operators; ${person.name} signs in with e-mail and password.` })
  }
  if (!person.active) {
    throw createError({ statusCode: 409, statusMessage: `${person.name}'s account is switched off. Ask the owner to switch it on first.` })
  }
  return person
}

/**
 * Gives an operator a PIN (the one typed, or a new random one), answered once. Their sessions
 * end: whoever signed in with the old PIN signs in again.
 */
export async function setPin(user: SessionUser, userId: number, typed: string | undefined) {
  const pin = typed ?? makePin()
  const hash = await hashPassword(pin)
  return transaction(async (tx) => {
    const person = await operatorForPin(tx, user.shopId, userId)
    await tx.updateTable('users').set({ pin_hash: hash }).where('id', '=', person.id).where('shop_id', '=', user.shopId).execute()
    await endSessions(tx, person.id)
    return { id: person.id, name: person.name, pin }
  })
}

/** Takes an operator's PIN away; the sessions they started with it end. */
export async function clearPin(user: SessionUser, userId: number) {
  return transaction(async (tx) => {
    const person = await tx.selectFrom('users').select(['id', 'name'])
      .where('id', '=', userId).where('shop_id', '=', user.shopId).forUpdate().executeTakeFirst()
    if (!person) notFound('person')
    await tx.updateTable('users').set({ pin_hash: null }).where('id', '=', person.id).where('shop_id', '=', user.shopId).execute()
    await endSessions(tx, person.id)
    return { id: person.id, name: person.name, hasPin: false }
  })
}

/**
 * Adds an operator by name only (no e-mail, no password) with a PIN. Names must tell people
 * apart on the device's list, so a name already in use in the shop (in any case) answers 409.
 */
export async function addOperator(user: SessionUser, name: string, typed: string | undefined) {
  const pin = typed ?? makePin()
  const hash = await hashPassword(pin)
  return transaction(async (tx) => {
    // One shop's additions wait on each other, so two people adding the same name at once cannot both get in.
    await sql`select pg_advisory_xact_lock(${0x4b4f5052}, ${user.shopId})`.execute(tx)
    const same = await tx.selectFrom('users').select('id')
      .where('shop_id', '=', user.shopId).where('active', '=', true).where(sql<string>`lower(name)`, '=', name.toLowerCase()).executeTakeFirst()
    if (same) {
      fieldError({ name: 'someone in the shop already has this name' }, {
        status: 409, message: `Someone in the shop is already called ${name}. Add an initial or a surname so the device's list tells them apart.`,
      })
    }
    const added = await tx.insertInto('users')
      .values({ shop_id: user.shopId, email: null, name, role: 'operator', pin_hash: hash })
      .returning(['id', 'name']).executeTakeFirstOrThrow()
    return { ...added, pin }
  })
}

// Verified against when the operator is unknown or has no PIN, so every answer takes as long.
let decoyPin: Promise<string> | undefined

/**
 * Signs in as one of the device's shop's operators with their PIN. Refused off an enrolled
 * device, on a revoked one, for anyone not an active operator of that shop with a PIN, and past
 * the throttle's limits.
 */
export async function pinSignIn(event: H3Event, userId: number, pin: string) {
  const db = useDb()
  const device = await currentDevice(db, event)
  if (!device) {
    throw createError({
      statusCode: 403,
      statusMessage: 'This browser is not one of the shop\'s devices (or it was revoked). Sign in with e-mail and password, or ask the crib manager to enrol it.',
    })
  }
  const attempt = await claimLoginAttempt(event, `pin:${userId}`, `device:${device.id}`, PIN_THROTTLE)
  const person = await db.selectFrom('users').select(['id', 'shop_id', 'name', 'role', 'pin_hash', 'active'])
    .where('id', '=', userId).where('shop_id', '=', device.shopId).where('role', '=', 'operator')
    .executeTakeFirst()
  decoyPin ??= hashPassword('000000-kerfbook-decoy')
  const ok = await verifyPassword(person?.pin_hash ?? await decoyPin, pin)
  if (!person?.pin_hash || !ok || !person.active) {
    throw createError({
      statusCode: 401,
      statusMessage: person?.pin_hash && ok && !person.active
        ? 'This account has been switched off. Ask the shop owner.'
        : 'Wrong PIN. Try again, or ask the crib manager for a new one.',
    })
  }
  await loginSucceeded(attempt)
  await db.updateTable('shop_devices').set({ last_used_at: sql`now()` }).where('id', '=', device.id).execute()
  await db.updateTable('users').set({ last_login_at: new Date() }).where('id', '=', person.id).execute()
  await startSession(event, { id: person.id, shopId: person.shop_id, name: person.name, role: person.role }, { deviceId: device.id })
  return loadMe(db, person.id)
}

/** What the sign-in page shows on this browser: the device and its shop's operators with a PIN, or nothing. */
export async function deviceSignInList(event: H3Event) {
  const db = useDb()
  const device = await currentDevice(db, event)
  if (!device) return { device: null, operators: [] }
  const operators = await db.selectFrom('users').select(['id', 'name'])
    .where('shop_id', '=', device.shopId).where('role', '=', 'operator').where('active', '=', true).where('pin_hash', 'is not', null)
    .orderBy('name').orderBy('id').execute()
  return { device: { name: device.name, shopName: device.shopName }, operators }
}
