// The owner sends the tooling report now, for their own shop only. It goes out even when there
// is nothing to report, and does not count as the nightly one.
export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const now = new Date()
  const outcome = await runShopReport(owner.shopId, {
    now, localDate: await localDateOf(owner.shopId, now), manual: true, baseUrl: publicBaseUrl(event),
  })
  setResponseStatus(event, 202)
  return outcome
})
