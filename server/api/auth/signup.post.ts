// Sign up: a new shop with its owner, and the common materials and chip loads to start from.
import { SignupBody } from '#shared/schemas/auth'
import { STARTING_MATERIALS } from '#shared/kerf/materials'

export default defineEventHandler(async (event) => {
  const body = await readValidatedBody(event, parseWith(SignupBody))
  const passwordHash = await hashPassword(body.password)
  const db = useDb()
  const taken = await db.selectFrom('users').select('id').where('email', '=', body.email).executeTakeFirst()
  if (taken) {
    fieldError({ email: 'already has an account' }, { status: 409, message: 'An account with this e-mail already exists. Sign in, or reset the password.' })
  }
  const owner = await transaction(async (tx) => {
    const shop = await tx.insertInto('shops').values({ name: body.shopName }).returning('id').executeTakeFirstOrThrow()
    await tx.insertInto('materials').values(STARTING_MATERIALS.map((m) => ({
      shop_id: shop.id, name: m.name, family: m.family, wear_factor: m.wearFactor, common: m.common,
    }))).execute()
    await tx.insertInto('chip_loads').values(startingChipLoadRows(shop.id)).execute()
    return tx.insertInto('users').values({
      shop_id: shop.id, email: body.email, name: body.name, role: 'owner', password_hash: passwordHash,
      last_login_at: new Date(),
    }).returning(['id', 'shop_id', 'name', 'role']).executeTakeFirstOrThrow()
  }).catch((err: unknown) => {
    // Two sign-ups with one e-mail at the same moment: the unique index decides.
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'An account with this e-mail already exists.' })
    throw err
  })
  await startSession(event, { id: owner.id, shopId: owner.shop_id, name: owner.name, role: owner.role })
  // The shop mails no one else until its owner confirms this address (server/utils/platform/shop-mail.ts).
  // A mail server that is down must not lose the sign-up: the account page sends the link again.
  await sendConfirmation(event, { id: owner.id, shopId: owner.shop_id, name: owner.name, email: body.email })
    .catch((err: unknown) => console.error(`[signup] the confirmation mail to ${body.email} failed:`, err))
  setResponseStatus(event, 201)
  return loadMe(db, owner.id)
})
