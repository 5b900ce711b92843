// Change a supplier, or archive it ({ active: false }): its types and orders keep it, pick lists
// drop it.
import { IdParams, SupplierUpdateBody } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  const body = await readValidatedBody(event, parseWith(SupplierUpdateBody))
  const db = useDb()
  await requireSupplier(db, user.shopId, id)
  if (body.name !== undefined) await assertNameFree(db, 'suppliers', user.shopId, body.name, id)
  const changes = {
    name: body.name, email: body.email, phone: body.phone, lead_time_days: body.leadTimeDays, regrind_turnaround_days: body.regrindTurnaroundDays, note: body.note, active: body.active,
  }
  if (Object.values(changes).some((v) => v !== undefined)) {
    await withUniqueName('suppliers', () => db.updateTable('suppliers').set(changes)
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute())
  }
  return requireSupplier(db, user.shopId, id)
})
