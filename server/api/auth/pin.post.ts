// Sign in as an operator with their PIN, on an enrolled shop device only; throttled per operator
// and per device (server/utils/platform/devices.ts).
import { PinSignInBody } from '#shared/schemas/devices'

export default defineEventHandler(async (event) => {
  const { userId, pin } = await readValidatedBody(event, parseWith(PinSignInBody))
  return pinSignIn(event, userId, pin)
})
