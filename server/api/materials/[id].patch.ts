// Change a material. A new wear factor counts from the next cut: logged cuts keep the factor
// they were logged with (cut_logs.wear_factor and life_added), so nothing already logged moves.
import { IdParams } from '#shared/schemas/crib'
import { MaterialUpdateBody } from '#shared/schemas/materials'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  const body = await readValidatedBody(event, parseWith(MaterialUpdateBody))
  const db = useDb()
  await requireMaterial(db, user.shopId, id)
  if (body.name !== undefined) await assertNameFree(db, 'materials', user.shopId, body.name, id)
  const changes = { name: body.name, family: body.family, wear_factor: body.wearFactor, common: body.common }
  if (Object.values(changes).some((v) => v !== undefined)) {
    await withUniqueName('materials', () => db.updateTable('materials').set(changes)
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute())
  }
  return requireMaterial(db, user.shopId, id)
})
