// Which bit for this material and this cut: the shop's cutter types ranked by the trade's rules
// and the shop's own outcomes, with the sharp cutters in the crib and, for a machine, starting feeds.
import { BitChoiceQuery } from '#shared/schemas/bit-choice'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const query = await getValidatedQuery(event, parseWith(BitChoiceQuery))
  return bitChoice(useDb(), user.shopId, query)
})
