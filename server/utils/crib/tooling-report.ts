// The morning tooling report: what to order, what to send out for resharpening and what to
// retire, and the batches overdue at the regrinder, built from the same code as the crib's
// reorder and resharpening pages.
import { showMoney } from '#shared/kerf/money'
import { FALLBACK_LOCALE, showDay } from '#shared/kerf/dates'
import type { Queryable } from '../../db/connect'
import type { OutgoingMail } from '../platform/mail'

export interface ToolingReport {
  isEmpty: boolean
  counts: { order: number, resharpen: number, retire: number, overdue: number }
  mail: Omit<OutgoingMail, 'to'>
}

const pct = (x: number) => `${Math.round(x * 100)} %`

export async function buildToolingReport(db: Queryable, shopId: number, opts: { baseUrl: string, now: Date, localDate: string }): Promise<ToolingReport> {
  const [shop, reorder, due, batches] = await Promise.all([
    db.selectFrom('shops').select('name').where('id', '=', shopId).executeTakeFirstOrThrow(),
    reorderRows(db, shopId, opts.now),
    dueCutters(db, shopId),
    regrindBatchList(db, shopId, opts.now),
  ])
  const overdue = batches.filter((b) => b.age?.overdue)
  const order = reorder.filter((r) => r.belowReorderPoint)
  const resharpen = due.cutters.filter((c) => c.action === 'resharpen')
  const retire = due.cutters.filter((c) => c.action === 'retire')
  const counts = { order: order.length, resharpen: resharpen.length, retire: retire.length, overdue: overdue.length }
  const isEmpty = !order.length && !resharpen.length && !retire.length && !overdue.length
  // The shop's own day, worded: "3 Dec 2026".
  const day = showDay(opts.localDate, FALLBACK_LOCALE)
  const lateWords = (b: (typeof overdue)[number]) => `${b.counts.out} of ${b.counts.items} still out, sent ${b.age!.ageDays} days ago to ${b.supplier?.name ?? 'the regrinder'}, `
    + `${b.age!.daysOverdue ? `${b.age!.daysOverdue} days` : 'just'} past the ${b.age!.turnaroundDays}-day turnaround`
  const base = opts.baseUrl
  const where = (c: { machineName: string | null }) => c.machineName ?? 'crib'
  const why = (c: { reason: string, lifeUsed: number }) => (c.reason === 'flagged_dull' ? 'flagged dull' : `${pct(c.lifeUsed)} of life used`)

  const subject = isEmpty
    ? `Tooling report ${day}: all clear`
    : `Tooling report ${day}: order ${counts.order}, resharpen ${counts.resharpen}, retire ${counts.retire}${overdue.length ? `, ${overdue.length} overdue at the regrinder` : ''}`

  const text: string[] = [`${shop.name}: tooling report for ${day}`, '']
  if (isEmpty) text.push('Nothing to order, resharpen or retire today.', '')
  if (order.length) {
    text.push(`ORDER (${order.length}) - ${base}/crib/reorder`)
    for (const r of order) {
      text.push(`- ${r.suggestedQty} x ${r.typeName} from ${r.supplierName ?? 'no supplier set'} (${showMoney(r.suggestedQty * r.unitCostCents)}): ${r.explanation}`)
    }
    text.push('')
  }
  if (resharpen.length) {
    text.push(`SEND OUT FOR RESHARPENING (${resharpen.length}) - ${base}/crib/regrind`)
    for (const c of resharpen) text.push(`- ${c.code} ${c.typeName}, in ${where(c)}: ${why(c)} ${base}/c/${c.code}`)
    text.push('')
  }
  if (overdue.length) {
    text.push(`OVERDUE AT THE REGRINDER (${overdue.length}) - ${base}/crib/regrind`)
    for (const b of overdue) text.push(`- Batch ${b.id}: ${lateWords(b)}`)
    text.push('')
  }
  if (retire.length) {
    text.push(`RETIRE AND REPLACE (${retire.length})`)
    for (const c of retire) text.push(`- ${c.code} ${c.typeName}, in ${where(c)}: ${why(c)}; ${c.retireReason ?? 'cannot be reground'} ${base}/c/${c.code}`)
    text.push('')
  }
  text.push(`Open Kerfbook: ${base}/`)

  const th = 'text-align:left;padding:8px 10px;border-bottom:2px solid #cfc8b8;font-size:13px;color:#3b4349'
  const td = 'padding:8px 10px;border-bottom:1px solid #e9e5da;font-size:15px;vertical-align:top'
  const link = (href: string, label: string) => `<a href="${escapeHtml(href)}" style="color:#135244;font-weight:bold">${escapeHtml(label)}</a>`
  const section = (title: string, href: string | null, head: string[], rows: string[][]) => rows.length
    ? `<h2 style="font-size:19px;margin:24px 0 8px">${escapeHtml(title)}${href ? ` <span style="font-size:14px">${link(href, 'open')}</span>` : ''}</h2>
<table style="border-collapse:collapse;width:100%"><tr>${head.map((h) => `<th style="${th}">${escapeHtml(h)}</th>`).join('')}</tr>
${rows.map((r) => `<tr>${r.map((cell) => `<td style="${td}">${cell}</td>`).join('')}</tr>`).join('\n')}</table>`
    : ''
  const html = `<!doctype html><html><body style="margin:0;background:#f6f4ee;font-family:Arial,sans-serif;color:#15191c">
<div style="max-width:640px;margin:0 auto;padding:20px">
<div style="font-weight:bold;font-size:20px;color:#135244">Kerfbook</div>
<h1 style="font-size:22px;margin:8px 0 4px">Tooling report, ${escapeHtml(day)}</h1>
<p style="margin:0 0 8px;color:#3b4349">${escapeHtml(shop.name)}</p>
${isEmpty ? '<p style="font-size:17px">Nothing to order, resharpen or retire today.</p>' : ''}
${section(`Order (${order.length})`, `${base}/crib/reorder`, ['Cutter type', 'Supplier', 'Order', 'Why'], order.map((r) => [
  escapeHtml(r.typeName), escapeHtml(r.supplierName ?? 'no supplier set'), `<strong>${r.suggestedQty}</strong><br>${showMoney(r.suggestedQty * r.unitCostCents)}`,
  escapeHtml(r.explanation),
]))}
${section(`Overdue at the regrinder (${overdue.length})`, `${base}/crib/regrind`, ['Batch', 'Why'], overdue.map((b) => [
  `Batch ${b.id}`, escapeHtml(lateWords(b)),
]))}
${section(`Send out for resharpening (${resharpen.length})`, `${base}/crib/regrind`, ['Cutter', 'Where', 'Why'], resharpen.map((c) => [
  `${link(`${base}/c/${c.code}`, c.code)}<br>${escapeHtml(c.typeName)}`, escapeHtml(where(c)), escapeHtml(why(c)),
]))}
${section(`Retire and replace (${retire.length})`, null, ['Cutter', 'Where', 'Why'], retire.map((c) => [
  `${link(`${base}/c/${c.code}`, c.code)}<br>${escapeHtml(c.typeName)}`, escapeHtml(where(c)), escapeHtml(`${why(c)}; ${c.retireReason ?? 'cannot be reground'}`),
]))}
<p style="margin-top:28px">${link(`${base}/`, 'Open Kerfbook')}</p>
</div></body></html>`
  return { isEmpty, counts, mail: { subject, text: text.join('\n'), html } }
}
