// Money tied up in stock per cutter type and the days each ran out in the last year: the
// reorder figures as the owner weighs them.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'owner')
  return stockInsight(useDb(), user.shopId)
})
