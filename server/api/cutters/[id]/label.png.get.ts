// A cutter's QR code as a PNG: the label image for a single reprint, or to show on screen.
// The code holds the cutter page's full URL, so any phone camera opens it.
import QRCode from 'qrcode'
import { z } from 'zod'
import { cutterPageUrl } from '#shared/kerf/labels'
import { QR_QUIET_MODULES } from '#shared/kerf/label-sizes'

const Params = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(Params))
  const cutter = await useDb().selectFrom('cutters').select('code')
    .where('id', '=', id).where('shop_id', '=', user.shopId)
    .executeTakeFirst()
  if (!cutter) notFound('cutter')
  const png = await QRCode.toBuffer(cutterPageUrl(publicBaseUrl(event), cutter.code), { errorCorrectionLevel: 'M', margin: QR_QUIET_MODULES, scale: 8 })
  setResponseHeaders(event, { 'content-type': 'image/png', 'cache-control': 'private, max-age=3600' })
  return png
})
