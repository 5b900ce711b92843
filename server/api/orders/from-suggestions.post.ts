// Turn reorder suggestions into draft purchase orders, one per supplier
// (server/utils/crib/order-actions.ts): 201 when a draft was made or topped up, 200 when every
// type was skipped, each with the reason.
import { FromSuggestionsBody } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { typeIds } = await readValidatedBody(event, parseWith(FromSuggestionsBody))
  const answer = await draftOrdersFromSuggestions(useDb(), user, typeIds)
  setResponseStatus(event, answer.orderIds.length ? 201 : 200)
  return answer
})
