// One-time links for invitations and password resets. The e-mail carries a random token; the
// database keeps only its SHA-256, so a leaked table cannot be turned into working links.
import { createHash, randomBytes } from 'node:crypto'
import { sql } from 'kysely'
import type { Queryable } from '../../db/connect'

export type TokenPurpose = 'invite' | 'reset'

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex')

export async function issueToken(db: Queryable, opts: {
  shopId: number, userId: number, purpose: TokenPurpose, createdBy?: number, ttlMinutes: number,
}): Promise<string> {
  const token = randomBytes(32).toString('base64url')
  // A new link replaces any earlier unused one of the same kind.
  await db.updateTable('auth_tokens').set({ used_at: sql`now()` })
    .where('user_id', '=', opts.userId).where('purpose', '=', opts.purpose).where('used_at', 'is', null)
    .execute()
  await db.insertInto('auth_tokens').values({
    shop_id: opts.shopId,
    user_id: opts.userId,
    purpose: opts.purpose,
    token_hash: hashToken(token),
    created_by: opts.createdBy ?? null,
    expires_at: new Date(Date.now() + opts.ttlMinutes * 60_000),
  }).execute()
  return token
}

/** The live token's user, or undefined when the link is unknown, used or expired. */
export async function findLiveToken(db: Queryable, purpose: TokenPurpose, token: string) {
  return db.selectFrom('auth_tokens as t')
    .innerJoin('users as u', 'u.id', 't.user_id')
    .innerJoin('shops as s', 's.id', 't.shop_id')
    .select(['t.id as tokenId', 'u.id as userId', 'u.shop_id as shopId', 'u.name', 'u.email', 'u.role', 'u.active', 's.name as shopName'])
    .where('t.token_hash', '=', hashToken(token))
    .where('t.purpose', '=', purpose)
    .where('t.used_at', 'is', null)
    .where('t.expires_at', '>', sql<Date>`now()`)
    .executeTakeFirst()
}

/** Marks the token used; false when another request used it first. */
export async function consumeToken(db: Queryable, tokenId: number): Promise<boolean> {
  const res = await db.updateTable('auth_tokens').set({ used_at: sql`now()` })
    .where('id', '=', tokenId).where('used_at', 'is', null)
    .executeTakeFirst()
  return Number(res.numUpdatedRows) === 1
}
