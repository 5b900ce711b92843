// The crib's inventory: the shop's cutters filtered, sorted and paged by the server, with the
// total for the pager and whether each one is due for resharpening or retirement.
import { InventoryQuery } from '#shared/schemas/inventory'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const query = await getValidatedQuery(event, parseWith(InventoryQuery))
  return listInventory(useDb(), user.shopId, query)
})
