// The shop's catalogue of cutter types with stock by status. Operators read it too (the phone
// pages name types); archived types only on request.
import { ListQuery } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { archived } = await getValidatedQuery(event, parseWith(ListQuery))
  return listCutterTypes(useDb(), user.shopId, { includeArchived: archived === 'include' })
})
