// The label sheet's contents: for each chosen cutter its code, the URL its QR code opens, the
// type in short and the QR code itself as SVG, so that the sheet needs no further requests.
// Operators reprint worn labels too, so every role may ask.
import QRCode from 'qrcode'
import { z } from 'zod'
import { cutterPageUrl, typeShort } from '#shared/kerf/labels'
import { QR_QUIET_MODULES } from '#shared/kerf/label-sizes'

const SELECTORS = ['ids', 'typeId', 'orderId'] as const
// Ids are PostgreSQL integers: a larger number would fail in the database rather than here.
const IdNumber = z.number().int('Give a whole number.').positive('Give a number above 0.').max(2 ** 31 - 1, 'That number is too large.')
const Id = z.coerce.number({ error: 'Give a whole number.' }).pipe(IdNumber)
const IdList = z.preprocess(
  (v) => (Array.isArray(v) ? v.join(',') : v),
  z.string().regex(/^\s*\d+\s*(,\s*\d+\s*)*$/, 'Give cutter ids as numbers separated by commas, for example 12,15,31.'),
).transform((s) => [...new Set(s.split(',').map((part) => Number(part.trim())))])
  .pipe(z.array(IdNumber).max(MAX_LABELS, `Print at most ${MAX_LABELS} labels at a time.`))

const Query = z.object({ ids: IdList.optional(), typeId: Id.optional(), orderId: Id.optional() })
  .superRefine((q, ctx) => {
    const given = SELECTORS.filter((key) => q[key] !== undefined)
    if (!given.length) ctx.addIssue({ code: 'custom', path: [], message: 'Say which cutters to label: give ids, typeId or orderId.' })
    for (const extra of given.slice(1)) {
      ctx.addIssue({ code: 'custom', path: [extra], message: `Give only one of ids, typeId or orderId, not ${given[0]} as well.` })
    }
  })

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'operator')
  const query = await getValidatedQuery(event, parseWith(Query))
  const selector = query.ids ? { ids: query.ids } : query.typeId ? { typeId: query.typeId } : { orderId: query.orderId! }
  const { title, rows } = await loadLabelCutters(useDb(), user.shopId, selector)
  const base = publicBaseUrl(event)
  const labels = await Promise.all(rows.map(async (c) => {
    const url = cutterPageUrl(base, c.code)
    return {
      id: c.id,
      code: c.code,
      url,
      typeName: c.typeName,
      short: typeShort({ cuttingDiameterMm: c.cutting_diameter_mm, profile: c.profile, vAngleDeg: c.v_angle_deg, flutes: c.flutes, helix: c.helix }, user.lengthUnit),
      // Each with its quiet zone of four modules inside the drawing, so that no layout can crowd it.
      qrSvg: await QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'M', margin: QR_QUIET_MODULES }),
      // The smallest label's: fewer modules, each larger on 18 mm.
      qrSvgLow: await QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'L', margin: QR_QUIET_MODULES }),
    }
  }))
  return { title, labels }
})
