// Starting feeds and speeds for one cutter type (or one cutter) in one material on one machine,
// with the melt warnings, the cautions and what the shop's own clean cuts of the pair ran at.
import { FeedsQuery } from '#shared/schemas/feeds'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const query = await getValidatedQuery(event, parseWith(FeedsQuery))
  return feedsFor(useDb(), user.shopId, query)
})
