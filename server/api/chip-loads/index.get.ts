// The shop's chip-load table: every material family's diameter bands with their starting figures.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  return chipLoadRows(useDb(), user.shopId)
})
