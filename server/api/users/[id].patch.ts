// The owner changes someone's role or switches their account off (or on again). The shop
// always keeps at least one active owner.
import { z } from 'zod'
import { UserUpdateBody } from '#shared/schemas/auth'

const Params = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const { id } = await getValidatedRouterParams(event, parseWith(Params))
  const body = await readValidatedBody(event, parseWith(UserUpdateBody))
  return transaction(async (tx) => {
    // Lock the shop's owners so two owners demoting each other at once cannot leave none.
    const owners = await tx.selectFrom('users').select('id')
      .where('shop_id', '=', owner.shopId).where('role', '=', 'owner').where('active', '=', true)
      .forUpdate().execute()
    const target = await tx.selectFrom('users').select(['id', 'role', 'active'])
      .where('id', '=', id).where('shop_id', '=', owner.shopId).executeTakeFirst()
    if (!target) notFound('person')
    const staysOwner = (body.role ?? target.role) === 'owner' && (body.active ?? target.active)
    if (owners.some((o) => o.id === id) && !staysOwner && owners.length <= 1) {
      throw createError({ statusCode: 409, statusMessage: 'The shop needs at least one owner. Make someone else owner first.' })
    }
    return tx.updateTable('users')
      .set({ ...(body.role && { role: body.role }), ...(body.active !== undefined && { active: body.active }) })
      .where('id', '=', id).where('shop_id', '=', owner.shopId)
      .returning(['id', 'name', 'email', 'role', 'active'])
      .executeTakeFirstOrThrow()
  })
})
