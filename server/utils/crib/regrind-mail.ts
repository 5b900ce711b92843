// The e-mail that tells the regrinder what is coming: one line per cutter with its label code,
// type and the diameter it leaves at. Sent after the batch is committed; a mail problem is
// reported to the person, never undoes the send.
import type { SessionUser } from '../platform/auth'
import type { OutgoingMail } from '../platform/mail'
import type { RegrindBatchView } from './regrind-view'
import type { ShopLetterhead } from './orders'

export function regrindBatchMail(m: {
  to: string, shop: ShopLetterhead, supplierName: string, sender: { name: string, email: string | null }, batch: RegrindBatchView
}): OutgoingMail {
  const shopName = m.shop.name
  const returnTo = letterheadLines(m.shop)
  const n = m.batch.items.length
  const bits = `${n} router bit${n === 1 ? '' : 's'}`
  const lines = m.batch.items.map((i) => `${i.code}  ${i.typeName}  ${i.diameterBeforeMm.toFixed(3)} mm`)
  const intro = `Hello ${m.supplierName}, ${shopName} is sending you ${bits} to resharpen (batch ${m.batch.number}).`
  // A crib manager added by name only has no address of their own: the shop's reply address stands in.
  const contact = m.sender.email ?? m.shop.replyEmail
  const outro = `Questions to ${m.sender.name}${contact ? `, ${contact}` : ''}. Please keep the label on each bit so it can be matched on its return.`
  const note = m.batch.note ? [`Note: ${m.batch.note}`] : []
  const back = `Please send them back to: ${returnTo.join(', ')}.`
  const rows = m.batch.items.map((i) => `<tr><td style="padding:4px 12px 4px 0;font-family:monospace;font-weight:bold">${escapeHtml(i.code)}</td>`
    + `<td style="padding:4px 12px 4px 0">${escapeHtml(i.typeName)}</td><td style="padding:4px 0;text-align:right">${i.diameterBeforeMm.toFixed(3)} mm</td></tr>`).join('')
  return {
    to: m.to,
    subject: `Resharpening: ${bits} from ${shopName} (batch ${m.batch.number})`,
    text: [intro, ...note, 'Label code, type, diameter as sent:', lines.join('\n'), back, outro].join('\n\n') + '\n',
    ...(m.shop.replyEmail && { replyTo: m.shop.replyEmail }),
    html: `<!doctype html><html><body style="margin:0;background:#f6f4ee;font-family:Arial,sans-serif;color:#15191c">
<div style="max-width:620px;margin:0 auto;padding:24px">
<p style="margin:0 0 16px">${escapeHtml(intro)}</p>${note.map((n) => `<p style="margin:0 0 16px">${escapeHtml(n)}</p>`).join('')}
<table style="border-collapse:collapse;margin:0 0 16px"><thead><tr><th style="text-align:left;padding:4px 12px 4px 0">Label code</th>
<th style="text-align:left;padding:4px 12px 4px 0">Type</th><th style="text-align:right;padding:4px 0">Diameter as sent</th></tr></thead><tbody>${rows}</tbody></table>
<p style="margin:0 0 16px">${escapeHtml(back)}</p>
<p style="margin:0;font-size:14px;color:#3b4349">${escapeHtml(outro)}</p>
</div></body></html>`,
  }
}

export interface BatchMailOutcome { sent: boolean, to: string | null, problem: string | null }

/** E-mails a sent batch's list to its supplier; says what happened instead of throwing. */
export async function mailBatchToSupplier(user: SessionUser, batch: RegrindBatchView): Promise<BatchMailOutcome> {
  const to = batch.supplier?.email ?? null
  if (!batch.supplier || !to) {
    return { sent: false, to: null, problem: 'The batch was sent, but its supplier has no e-mail address, so no list was e-mailed.' }
  }
  const shop = await shopLetterhead(useDb(), user.shopId)
  try {
    await sendShopMail(user.shopId, 'regrind', regrindBatchMail({ to, shop, supplierName: batch.supplier.name, sender: user, batch }))
    return { sent: true, to, problem: null }
  } catch (err) {
    console.error(`[regrind] e-mail for batch ${batch.id} to ${to} failed:`, err)
    const reason = isError(err) ? err.statusMessage : err instanceof Error ? err.message : String(err)
    return { sent: false, to, problem: `The batch was sent, but the e-mail to ${to} failed (${reason}). Send the list another way.` }
  }
}
