// An uploaded photo, for signed-in people of the shop that owns it and nobody else.
import { z } from 'zod'

const Params = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(Params))
  const upload = await useDb().selectFrom('uploads').select(['storage_key', 'content_type'])
    .where('shop_id', '=', user.shopId).where('id', '=', id).executeTakeFirst()
  if (!upload) notFound('upload')
  const data = await useStorage('uploads').getItemRaw<Buffer>(upload.storage_key)
  if (!data) throw createError({ statusCode: 410, statusMessage: 'The file of this upload is missing from storage.' })
  setResponseHeaders(event, {
    'content-type': upload.content_type,
    'cache-control': 'private, max-age=86400',
    'x-content-type-options': 'nosniff',
  })
  return data
})
