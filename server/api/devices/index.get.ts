// The shop's enrolled devices with their last use, and its operators with whether each has a PIN.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const db = useDb()
  const [devices, operators] = await Promise.all([listDevices(db, event, user.shopId), listOperators(db, user.shopId)])
  return { devices, operators }
})
