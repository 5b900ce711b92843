// One resharpening batch with its cutters, their diameters, results and costs.
import { BatchIdParams } from '#shared/schemas/regrind'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(BatchIdParams))
  return requireRegrindBatchView(useDb(), user.shopId, id)
})
