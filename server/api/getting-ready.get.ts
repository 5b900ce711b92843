// The getting-ready steps of Home, each ticked from the shop's own rows; for the crib manager and owner.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  return gettingReady(useDb(), user.shopId, user.role)
})
