// The shop's materials with family and wear factor, the common ones first; `?retired=include`
// adds the retired ones (the crib's material page).
import { MaterialListQuery } from '#shared/schemas/materials'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { retired } = await getValidatedQuery(event, parseWith(MaterialListQuery))
  return listMaterials(useDb(), user.shopId, { retired: retired === 'include' })
})
