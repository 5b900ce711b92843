// The shop's suppliers with how many active cutter types each sells; archived ones on request.
import { ListQuery } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { archived } = await getValidatedQuery(event, parseWith(ListQuery))
  let q = supplierQuery(useDb(), user.shopId)
  if (archived !== 'include') q = q.where('s.active', '=', true)
  const rows = await q.orderBy('s.active', 'desc').orderBy('s.name').execute()
  return rows.map((s) => ({ ...s, typeCount: Number(s.typeCount) }))
})
