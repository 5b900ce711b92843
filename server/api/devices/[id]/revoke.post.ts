// Revoke one of the shop's devices at once: no one can sign in on it with a PIN any more, and
// everyone signed in on it that way is signed out.
import { z } from 'zod'

const Params = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(Params))
  return revokeDevice(user, id)
})
