// Change one's own name or length unit (millimetres or inches).
import { MeUpdateBody } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const body = await readValidatedBody(event, parseWith(MeUpdateBody))
  const db = useDb()
  if (body.name !== undefined || body.lengthUnit !== undefined) {
    await db.updateTable('users')
      .set({ ...(body.name !== undefined && { name: body.name }), ...(body.lengthUnit && { length_unit: body.lengthUnit }) })
      .where('id', '=', user.id).where('shop_id', '=', user.shopId)
      .execute()
  }
  return loadMe(db, user.id)
})
