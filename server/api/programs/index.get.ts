// The shop's NC programs, newest first: name, size, tools, total minutes, who uploaded them.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  return { programs: await listPrograms(useDb(), user.shopId) }
})
