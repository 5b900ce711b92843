// The label sheet's contents (server/utils/crib/labels.ts). Operators reprint worn labels too,
// so every role may ask.
import { LabelsQuery } from '#shared/schemas/labels'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'operator')
  const query = await getValidatedQuery(event, parseWith(LabelsQuery))
  const selector = query.ids ? { ids: query.ids } : query.typeId ? { typeId: query.typeId } : { orderId: query.orderId! }
  return labelSheet(useDb(), user, selector, publicBaseUrl(event))
})
