// Add a supplier.
import { SupplierBody } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readValidatedBody(event, parseWith(SupplierBody))
  const db = useDb()
  await assertNameFree(db, 'suppliers', user.shopId, body.name)
  const { id } = await withUniqueName('suppliers', () => db.insertInto('suppliers')
    .values({ shop_id: user.shopId, name: body.name, email: body.email ?? null, phone: body.phone ?? null, lead_time_days: body.leadTimeDays, regrind_turnaround_days: body.regrindTurnaroundDays, note: body.note })
    .returning('id').executeTakeFirstOrThrow())
  setResponseStatus(event, 201)
  return requireSupplier(db, user.shopId, id)
})
