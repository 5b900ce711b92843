// Add an operator by name only, with a PIN (typed, or a random one answered this once): for
// operators without a company e-mail, who sign in on the shop's devices.
import { AddOperatorBody } from '#shared/schemas/devices'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { name, pin } = await readValidatedBody(event, parseWith(AddOperatorBody))
  const added = await addOperator(user, name, pin)
  setResponseStatus(event, 201)
  return added
})
