// A crib manager or owner gives an operator a PIN for the shop's devices: the one typed, or a
// random one answered this once. The operator's sessions end.
import { z } from 'zod'
import { SetPinBody } from '#shared/schemas/devices'

const Params = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(Params))
  const { pin } = await readValidatedBody(event, parseWith(SetPinBody))
  return setPin(user, id, pin)
})
