// The shop's settings (report time and recipients, due threshold, regrind and ordering figures).
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  return shopSettings(useDb(), user.shopId)
})
