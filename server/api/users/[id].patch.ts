// The owner changes someone's role or switches their account off (or on again). The shop
// always keeps at least one active owner who can sign in.
import { z } from 'zod'
import { UserUpdateBody } from '#shared/schemas/auth'

const Params = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const { id } = await getValidatedRouterParams(event, parseWith(Params))
  const body = await readValidatedBody(event, parseWith(UserUpdateBody))
  return transaction(async (tx) => {
    // Lock the shop's owners so two owners demoting each other at once cannot leave none. Only
    // owners who can sign in count: one invited but never joined has no password yet. The person
    // changed is locked in the same statement, all in id order, so that requests locking either
    // take them in one order; FOR NO KEY UPDATE leaves the owners' other work (rows that refer to
    // them) free to go on meanwhile.
    const locked = await tx.selectFrom('users').select(['id', 'role', 'active', 'password_hash'])
      .where('shop_id', '=', owner.shopId)
      .where((eb) => eb.or([
        eb('id', '=', id),
        eb.and([eb('role', '=', 'owner'), eb('active', '=', true), eb('password_hash', 'is not', null)]),
      ]))
      .orderBy('id').forNoKeyUpdate().execute()
    const owners = locked.filter((u) => u.role === 'owner' && u.active && u.password_hash !== null)
    const target = await tx.selectFrom('users').select(['id', 'name', 'role', 'active', 'email', 'password_hash'])
      .where('id', '=', id).where('shop_id', '=', owner.shopId).executeTakeFirst()
    if (!target) notFound('person')
    // A PIN signs in operators only: someone added by name only could not sign in in another role.
    if (body.role && body.role !== 'operator' && !target.email && !target.password_hash) {
      fieldError({ role: 'signs in with a PIN only' }, {
        status: 409,
        message: `${target.name} has no e-mail address and signs in with a PIN, which works for operators only. Invite them by e-mail in the new role instead.`,
      })
    }
    const staysOwner = (body.role ?? target.role) === 'owner' && (body.active ?? target.active)
    if (owners.some((o) => o.id === id) && !staysOwner && owners.length <= 1) {
      throw createError({ statusCode: 409, statusMessage: 'The shop needs at least one owner. Make someone else owner first.' })
    }
    const updated = await tx.updateTable('users')
      .set({ ...(body.role && { role: body.role }), ...(body.active !== undefined && { active: body.active }) })
      .where('id', '=', id).where('shop_id', '=', owner.shopId)
      .returning(['id', 'name', 'email', 'role', 'active'])
      .executeTakeFirstOrThrow()
    // A new role, or an account switched off, ends the person's sessions: they sign in again
    // (and an account switched on again does not bring old cookies back to life).
    if (updated.role !== target.role || updated.active !== target.active) await endSessions(tx, id)
    return updated
  })
})
