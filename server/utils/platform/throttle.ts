// Sign-in throttling, kept in PostgreSQL so that every app instance sees the same counts.
// Counting and deciding are one step: under locks on the account and the address, the attempt is
// counted and, when allowed, recorded as failed before the password is even checked, so attempts
// sent at once see each other; a right password turns its row into a success afterwards.
// Failures count since the window opened or since the last successful sign-in to that account,
// whichever is later. An account is throttled per address (five wrong tries from one place lock
// that place out, not the person elsewhere); only when failures pile up from many addresses does
// the account close to every address that has failed on it, and a right password from an
// address with no failures still gets through.
import type { H3Event } from 'h3'
import { sql } from 'kysely'

// The first key of the two-key advisory locks taken here (the report runner uses another).
const THROTTLE_LOCK = 0x4b4c4f47

/**
 * The client's address. Behind NUXT_TRUST_PROXY (true for one proxy, or the number of proxies in
 * front), each trusted proxy appends the address it got the request from to X-Forwarded-For; the
 * entries before those are the client's own words. So the address is counted from the right.
 */
export function clientAddress(event: H3Event): string {
  const trust = useRuntimeConfig().trustProxy as unknown
  const hops = trust === true || trust === 'true' ? 1 : Math.max(0, Math.floor(Number(trust) || 0))
  const direct = getRequestIP(event) ?? 'unknown'
  if (!hops) return direct
  const forwarded = (getRequestHeader(event, 'x-forwarded-for') ?? '').split(',').map((a) => a.trim()).filter(Boolean)
  return forwarded[Math.max(0, forwarded.length - hops)] ?? direct
}

/** Limits of a kind of sign-in, and how its refusal names what is locked out. */
export interface ThrottleRules {
  limits: { windowMinutes: number, perAccount: number, perAddress: number, perAccountEverywhere: number }
  words: { account: string, address: string, advice: string }
}

const PASSWORD_WORDS: ThrottleRules['words'] = { account: 'this account', address: 'this network address', advice: 'or reset the password' }

/**
 * Decides whether this sign-in may be tried and, when it may, records it as a failure until
 * proven otherwise. Answers the attempt's id for loginSucceeded, or throws 429 with Retry-After.
 * `email` and `address` are the two things counted: for a PIN, the operator and the shop device.
 */
export async function claimLoginAttempt(event: H3Event, email: string, address: string, rules?: ThrottleRules): Promise<string> {
  const loginThrottle = rules?.limits ?? useRuntimeConfig().loginThrottle
  const words = rules?.words ?? PASSWORD_WORDS
  const windowMs = Number(loginThrottle.windowMinutes) * 60_000
  const refusal = await transaction(async (tx) => {
    // Always the account first, then the address, so two requests never wait on each other in a ring.
    await sql`select pg_advisory_xact_lock(${THROTTLE_LOCK}, hashtext(${`account:${email}`}))`.execute(tx)
    await sql`select pg_advisory_xact_lock(${THROTTLE_LOCK}, hashtext(${`address:${address}`}))`.execute(tx)
    const since = sql<Date>`greatest(now() - make_interval(mins => ${Number(loginThrottle.windowMinutes)}),
      coalesce((select max(attempted_at) from login_attempts where email = ${email} and succeeded), '-infinity'::timestamptz))`
    const counts = await sql<{ pair: string, account: string, address: string, pair_oldest: Date | null, account_oldest: Date | null, address_oldest: Date | null }>`
      select count(*) filter (where email = ${email} and address = ${address} and attempted_at > ${since}) as pair,
             min(attempted_at) filter (where email = ${email} and address = ${address} and attempted_at > ${since}) as pair_oldest,
             count(*) filter (where email = ${email} and attempted_at > ${since}) as account,
             min(attempted_at) filter (where email = ${email} and attempted_at > ${since}) as account_oldest,
             count(*) filter (where address = ${address}) as address,
             min(attempted_at) filter (where address = ${address}) as address_oldest
        from login_attempts
       where (email = ${email} or address = ${address}) and not succeeded
         and attempted_at > now() - make_interval(mins => ${Number(loginThrottle.windowMinutes)})
    `.execute(tx).then((r) => r.rows[0]!)
    const pair = Number(counts.pair)
    const limits = [
      { over: pair >= Number(loginThrottle.perAccount), oldest: counts.pair_oldest, what: words.account },
      { over: Number(counts.address) >= Number(loginThrottle.perAddress), oldest: counts.address_oldest, what: words.address },
      { over: pair > 0 && Number(counts.account) >= Number(loginThrottle.perAccountEverywhere), oldest: counts.account_oldest, what: words.account },
    ]
    const hit = limits.find((l) => l.over)
    if (hit) return hit
    return tx.insertInto('login_attempts').values({ email, address, succeeded: false }).returning('id').executeTakeFirstOrThrow()
  })
  if ('id' in refusal) return String(refusal.id)
  const retryAfter = Math.max(1, Math.ceil(((refusal.oldest ? new Date(refusal.oldest).getTime() : Date.now()) + windowMs - Date.now()) / 1000))
  setResponseHeader(event, 'Retry-After', retryAfter)
  throw createError({
    statusCode: 429,
    statusMessage: `Too many failed sign-ins for ${refusal.what}. Wait ${Math.ceil(retryAfter / 60)} minute(s) ${words.advice}.`,
    data: { retryAfterSeconds: retryAfter },
  })
}

/** The attempt claimed by claimLoginAttempt had the right password: it is a success, not a failure. */
export async function loginSucceeded(attemptId: string): Promise<void> {
  await useDb().updateTable('login_attempts').set({ succeeded: true }).where('id', '=', attemptId).execute()
}
