// The owner signs one person out everywhere (a lost phone, a shared desk left signed in).
import { z } from 'zod'

const Params = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

export default defineEventHandler(async (event) => {
  const owner = await requireRole(event, 'owner')
  const { id } = await getValidatedRouterParams(event, parseWith(Params))
  const person = await useDb().selectFrom('users').select('id')
    .where('id', '=', id).where('shop_id', '=', owner.shopId).executeTakeFirst()
  if (!person) notFound('person')
  await endSessions(useDb(), person.id)
  setResponseStatus(event, 204)
  return null
})
