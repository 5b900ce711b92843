// Bring a retired material back into the pick lists.
import { IdParams } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  const db = useDb()
  await requireMaterial(db, user.shopId, id)
  await db.updateTable('materials').set({ active: true, retired_at: null })
    .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
  return requireMaterial(db, user.shopId, id)
})
