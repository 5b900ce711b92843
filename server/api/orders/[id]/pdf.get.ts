// The purchase order as a PDF, the same file the supplier's e-mail carries.
import { OrderIdParams } from '#shared/schemas/orders'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(OrderIdParams))
  const db = useDb()
  const [order, shop] = await Promise.all([orderView(db, user.shopId, id), orderLetterhead(db, user.shopId)])
  const pdf = await orderPdf(order, shop)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="${orderPdfName(order)}"`,
    'cache-control': 'private, no-store',
  })
  return pdf
})
