// The machine's tool-number → pocket map (tools not in it use the pocket of their own number).
import { IdParams } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  await requireMachine(useDb(), user.shopId, id)
  const map = await toolMapOf(useDb(), user.shopId, id)
  return { map: [...map].map(([tool, pocket]) => ({ tool, pocket })) }
})
