// The shop's resharpening batches, newest first, with their counts, status and cost.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  return regrindBatchList(useDb(), user.shopId)
})
