// Past tooling reports of the shop: when, to whom, what it said in short, and any failure.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const rows = await useDb().selectFrom('tooling_reports')
    .select(['id', 'report_date', 'status', 'recipients', 'subject', 'attempts', 'error', 'manual', 'created_at', 'sent_at'])
    .where('shop_id', '=', user.shopId)
    .orderBy('created_at', 'desc').limit(200)
    .execute()
  return rows.map((r) => ({
    id: r.id, reportDate: r.report_date, status: r.status, recipients: r.recipients, subject: r.subject, attempts: r.attempts,
    error: r.error, manual: r.manual, createdAt: r.created_at, sentAt: r.sent_at,
  }))
})
