// Retire a material: it leaves the cut-log and feeds pick lists; logged cuts keep it.
import { IdParams } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  const db = useDb()
  await requireMaterial(db, user.shopId, id)
  await db.updateTable('materials').set({ active: false, retired_at: new Date() })
    .where('shop_id', '=', user.shopId).where('id', '=', id).where('active', '=', true).execute()
  return requireMaterial(db, user.shopId, id)
})
