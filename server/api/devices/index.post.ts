// Enrol the browser this crib manager or owner is on as one of the shop's devices: operators
// then sign in on it by name and PIN. The credential goes into an HttpOnly cookie.
import { EnrolDeviceBody } from '#shared/schemas/devices'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { name } = await readValidatedBody(event, parseWith(EnrolDeviceBody))
  const device = await enrolDevice(event, user, name)
  setResponseStatus(event, 201)
  return { device, message: `This browser is now the shop device "${device.name}". Operators with a PIN can sign in on it.` }
})
