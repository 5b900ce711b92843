// The signed-in user and their shop.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  return loadMe(useDb(), user.id)
})
