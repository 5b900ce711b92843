// Take an operator's PIN away: they no longer appear on the shop's devices, and their sessions end.
import { z } from 'zod'

const Params = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(Params))
  return clearPin(user, id)
})
