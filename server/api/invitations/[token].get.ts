// What an invitation link is for, so the page can greet the person before they set a password.
import { z } from 'zod'
import { Token } from '#shared/schemas/auth'

const Params = z.object({ token: Token })

export default defineEventHandler(async (event) => {
  const { token } = await getValidatedRouterParams(event, parseWith(Params))
  const found = await findLiveToken(useDb(), 'invite', token)
  if (!found || !found.active) {
    throw createError({ statusCode: 404, statusMessage: 'This invitation is not valid any more. Ask the shop owner to send a new one.' })
  }
  return { name: found.name, email: found.email, role: found.role, shopName: found.shopName }
})
