// The shop's machines, with their spindle speed ranges, pockets and the cutters in them;
// `?retired=include` adds the retired ones (the crib's machine page).
import { MachineListQuery } from '#shared/schemas/machines'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { retired } = await getValidatedQuery(event, parseWith(MachineListQuery))
  return listMachines(useDb(), user.shopId, { retired: retired === 'include' })
})
