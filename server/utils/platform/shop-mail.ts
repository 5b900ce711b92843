// Mail a shop sends to other people (invitations, orders, regrind batches, the morning report)
// goes through sendShopMail: nothing leaves until the shop's owner has confirmed their own
// address (so a stranger cannot sign up and make Kerfbook mail text of their choosing to anyone),
// and no shop sends more than its hourly limit. Mail to a person about their own account
// (confirming the address, a reset link) goes through sendAccountMail, limited per address.
import { sql } from 'kysely'
import type { Queryable } from '../../db/connect'
import type { OutgoingMail } from './mail'

// The first key of the advisory locks that make counting and sending one step.
const MAIL_LOCK = 0x4d41494c

const recipientsOf = (mail: OutgoingMail) => (Array.isArray(mail.to) ? mail.to.length : 1)

/** Whether the shop may mail others yet: one of its owners has confirmed their address. */
export async function shopMailConfirmed(db: Queryable, shopId: number): Promise<boolean> {
  const row = await db.selectFrom('users').select('id')
    .where('shop_id', '=', shopId).where('role', '=', 'owner').where('active', '=', true)
    .where('email_confirmed_at', 'is not', null)
    .executeTakeFirst()
  return Boolean(row)
}

/** Counts the mail against the shop's hour and sends it; 403 before the owner confirmed, 429 over the limit. */
export async function sendShopMail(shopId: number, kind: string, mail: OutgoingMail): Promise<void> {
  const limit = Number(useRuntimeConfig().mailLimits.perShopPerHour)
  const recipients = recipientsOf(mail)
  await transaction(async (tx) => {
    if (!(await shopMailConfirmed(tx, shopId))) {
      throw createError({
        statusCode: 403,
        statusMessage: 'Kerfbook sends no mail for this shop until its owner confirms their e-mail address: the owner can open the link we sent, or send it again from the account page.',
      })
    }
    await sql`select pg_advisory_xact_lock(${MAIL_LOCK}, ${shopId})`.execute(tx)
    const sent = await tx.selectFrom('shop_mails').select((eb) => eb.fn.coalesce(eb.fn.sum<number>('recipients'), eb.lit(0)).as('n'))
      .where('shop_id', '=', shopId).where('sent_at', '>', sql<Date>`now() - interval '1 hour'`)
      .executeTakeFirstOrThrow()
    if (Number(sent.n) + recipients > limit) {
      throw createError({
        statusCode: 429,
        statusMessage: `This shop has sent ${Number(sent.n)} e-mails in the last hour, and Kerfbook sends at most ${limit} an hour for one shop. Try again later.`,
      })
    }
    await tx.insertInto('shop_mails').values({ shop_id: shopId, kind, recipients }).execute()
    // Sent inside the transaction: a mail the server refused does not count against the hour.
    await sendMail(mail)
  })
}

/**
 * A link to a person's own address (confirm it, reset a password): sent unless a link of the same
 * kind is still fresh (a second request must not cancel a link on its way) or the address had
 * its hourly share of links already. Answers whether a mail went out.
 */
export async function sendAccountLink(user: { id: number, shopId: number }, purpose: 'reset' | 'confirm', ttlMinutes: number,
  mailFor: (token: string) => OutgoingMail): Promise<boolean> {
  const { perAddressPerHour, freshLinkMinutes } = useRuntimeConfig().mailLimits
  const token = await transaction(async (tx) => {
    await sql`select pg_advisory_xact_lock(${MAIL_LOCK}, ${-user.id})`.execute(tx)
    const recent = await tx.selectFrom('auth_tokens')
      .select([
        (eb) => eb.fn.countAll<number>().as('n'),
        (eb) => eb.fn.countAll<number>().filterWhere((w) => w.and([
          w('used_at', 'is', null), w('expires_at', '>', sql<Date>`now()`),
          w('created_at', '>', sql<Date>`now() - make_interval(mins => ${Number(freshLinkMinutes)})`),
        ])).as('fresh'),
      ])
      .where('user_id', '=', user.id).where('purpose', '=', purpose)
      .where('created_at', '>', sql<Date>`now() - interval '1 hour'`)
      .executeTakeFirstOrThrow()
    if (Number(recent.fresh) > 0 || Number(recent.n) >= Number(perAddressPerHour)) return undefined
    return issueToken(tx, { shopId: user.shopId, userId: user.id, purpose, ttlMinutes })
  })
  if (!token) return false
  await sendMail(mailFor(token))
  return true
}
