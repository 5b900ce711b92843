// Invite a person into the shop with a role; they get an e-mail with a link to set a password.
// Inviting the same pending person again sends a fresh link.
import { InvitationBody } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const body = await readValidatedBody(event, parseWith(InvitationBody))
  const { user, token, shopName } = await transaction(async (tx) => {
    const existing = await tx.selectFrom('users').select(['id', 'shop_id', 'password_hash'])
      .where('email', '=', body.email).forUpdate().executeTakeFirst()
    if (existing && (existing.shop_id !== owner.shopId || existing.password_hash)) {
      fieldError({ email: 'already has an account' }, {
        status: 409,
        message: existing.shop_id === owner.shopId
          ? 'This person already has an account in your shop.'
          : 'This e-mail address already belongs to an account in another shop.',
      })
    }
    const user = existing
      ? await tx.updateTable('users').set({ name: body.name, role: body.role, active: true })
        .where('id', '=', existing.id).where('shop_id', '=', owner.shopId)
        .returning(['id', 'name', 'email', 'role']).executeTakeFirstOrThrow()
      : await tx.insertInto('users').values({ shop_id: owner.shopId, email: body.email, name: body.name, role: body.role })
        .returning(['id', 'name', 'email', 'role']).executeTakeFirstOrThrow()
    const token = await issueToken(tx, { shopId: owner.shopId, userId: user.id, purpose: 'invite', createdBy: owner.id, ttlMinutes: 7 * 24 * 60 })
    const shop = await tx.selectFrom('shops').select('name').where('id', '=', owner.shopId).executeTakeFirstOrThrow()
    return { user, token, shopName: shop.name }
  }).catch((err: unknown) => {
    // The same new address invited twice at the same moment: the unique index on e-mail decides.
    if (isUniqueViolation(err)) {
      throw createError({ statusCode: 409, statusMessage: 'This address was invited a moment ago. Refresh the list of people to see it.' })
    }
    throw err
  })
  await sendShopMail(owner.shopId, 'invitation', invitationMail({
    to: body.email, name: user.name, shopName, role: user.role, invitedBy: owner.name,
    link: `${publicBaseUrl(event)}/invite/${token}`,
  }))
  setResponseStatus(event, 201)
  return { user: { ...user, status: 'invited' as const }, message: `Invitation sent to ${body.email}.` }
})
