// An ad-hoc delivery with no purchase order (a sample, a bit bought over the counter): the
// cutters are created with label codes, ready for their label sheet.
import { DeliveryBody } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readValidatedBody(event, parseWith(DeliveryBody))
  const created = await transaction(async (tx) => {
    const type = await tx.selectFrom('cutter_types').select(['id', 'cutting_diameter_mm'])
      .where('shop_id', '=', user.shopId).where('id', '=', body.typeId).where('active', '=', true).executeTakeFirst()
    if (!type) badField('typeId', 'no such cutter type in your shop')
    return createCutters(tx, user.shopId, user.id, Array.from({ length: body.quantity }, () => ({
      typeId: type.id, diameterMm: body.diameterMm ?? type.cutting_diameter_mm, note: body.note ?? 'Delivery without an order',
    })))
  })
  setResponseStatus(event, 201)
  return { cutters: created.map((c) => ({ id: c.id, code: c.code, typeId: c.type_id })), labelsUrl: `/labels?ids=${created.map((c) => c.id).join(',')}` }
})
