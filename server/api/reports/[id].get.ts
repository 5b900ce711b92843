// One past tooling report with what it said.
import { z } from 'zod'

const Params = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(Params))
  const r = await useDb().selectFrom('tooling_reports').selectAll()
    .where('shop_id', '=', user.shopId).where('id', '=', id).executeTakeFirst()
  if (!r) notFound('report')
  return {
    id: r.id, reportDate: r.report_date, status: r.status, recipients: r.recipients, subject: r.subject, attempts: r.attempts,
    error: r.error, manual: r.manual, createdAt: r.created_at, sentAt: r.sent_at, text: r.body_text, html: r.body_html,
  }
})
