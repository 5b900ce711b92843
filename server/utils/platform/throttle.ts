// Sign-in throttling per account and per address, kept in PostgreSQL so that every app
// instance sees the same counts. Failures count since the window opened or since the last
// successful sign-in to that account, whichever is later.
import type { H3Event } from 'h3'
import { sql } from 'kysely'

export function clientAddress(event: H3Event): string {
  const { trustProxy } = useRuntimeConfig()
  return getRequestIP(event, { xForwardedFor: Boolean(trustProxy) }) ?? 'unknown'
}

export async function assertNotThrottled(event: H3Event, email: string, address: string): Promise<void> {
  const { loginThrottle } = useRuntimeConfig()
  const windowStart = sql<Date>`now() - make_interval(mins => ${Number(loginThrottle.windowMinutes)})`
  const db = useDb()
  const [byAccount, byAddress] = await Promise.all([
    db.selectFrom('login_attempts')
      .select([(eb) => eb.fn.countAll<number>().as('n'), (eb) => eb.fn.min('attempted_at').as('oldest')])
      .where('email', '=', email)
      .where('succeeded', '=', false)
      .where('attempted_at', '>', windowStart)
      .where('attempted_at', '>', (eb) => eb.fn.coalesce(
        eb.selectFrom('login_attempts').select((e) => e.fn.max('attempted_at').as('t'))
          .where('email', '=', email).where('succeeded', '=', true),
        sql<Date>`'-infinity'::timestamptz`,
      ))
      .executeTakeFirstOrThrow(),
    db.selectFrom('login_attempts')
      .select([(eb) => eb.fn.countAll<number>().as('n'), (eb) => eb.fn.min('attempted_at').as('oldest')])
      .where('address', '=', address)
      .where('succeeded', '=', false)
      .where('attempted_at', '>', windowStart)
      .executeTakeFirstOrThrow(),
  ])
  const windowMs = Number(loginThrottle.windowMinutes) * 60_000
  for (const [count, limit, oldest, what] of [
    [byAccount.n, Number(loginThrottle.perAccount), byAccount.oldest, 'this account'],
    [byAddress.n, Number(loginThrottle.perAddress), byAddress.oldest, 'this network address'],
  ] as const) {
    if (Number(count) >= limit) {
      const retryAfter = Math.max(1, Math.ceil(((oldest ? new Date(oldest).getTime() : Date.now()) + windowMs - Date.now()) / 1000))
      setResponseHeader(event, 'Retry-After', retryAfter)
      throw createError({
        statusCode: 429,
        statusMessage: `Too many failed sign-ins for ${what}. Wait ${Math.ceil(retryAfter / 60)} minute(s) or reset the password.`,
        data: { retryAfterSeconds: retryAfter },
      })
    }
  }
}

export async function recordLoginAttempt(email: string, address: string, succeeded: boolean): Promise<void> {
  await useDb().insertInto('login_attempts').values({ email, address, succeeded }).execute()
}
