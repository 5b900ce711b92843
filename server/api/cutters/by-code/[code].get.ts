// The cutter behind a label code: what the phone shows after a scan.
import { z } from 'zod'
import { normalizeLabelCode } from '#shared/kerf/label-code'

const Params = z.object({ code: z.string().min(1).max(40).transform(normalizeLabelCode) })

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { code } = await getValidatedRouterParams(event, parseWith(Params))
  return requireCutterView(useDb(), user.shopId, { code })
})
