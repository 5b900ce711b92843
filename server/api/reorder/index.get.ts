// Every cutter type with the figures behind its reorder suggestion, the ones to order first.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const rows = await reorderRows(useDb(), user.shopId)
  return rows.sort((a, b) => Number(b.belowReorderPoint) - Number(a.belowReorderPoint) || a.typeName.localeCompare(b.typeName))
})
