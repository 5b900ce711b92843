// Add a material with its family and starting wear factor.
import { MaterialBody } from '#shared/schemas/materials'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readValidatedBody(event, parseWith(MaterialBody))
  const db = useDb()
  await assertNameFree(db, 'materials', user.shopId, body.name)
  const { id } = await withUniqueName('materials', () => db.insertInto('materials').values({
    shop_id: user.shopId, name: body.name, family: body.family, wear_factor: body.wearFactor, common: body.common ?? true,
  }).returning('id').executeTakeFirstOrThrow())
  setResponseStatus(event, 201)
  return requireMaterial(db, user.shopId, id)
})
