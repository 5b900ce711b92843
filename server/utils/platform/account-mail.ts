// The e-mails about accounts: invitations and password resets. Plain text and simple HTML.
import { ROLE_LABELS, type Role } from '#shared/kerf/roles'
import type { OutgoingMail } from './mail'

function layout(title: string, paragraphs: string[], link: { href: string, label: string }): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 16px">${escapeHtml(p)}</p>`).join('')
  return `<!doctype html><html><body style="margin:0;background:#f6f4ee;font-family:Arial,sans-serif;color:#15191c">
<div style="max-width:520px;margin:0 auto;padding:24px">
<div style="font-weight:bold;font-size:20px;color:#135244;margin-bottom:16px">Kerfbook</div>
<h1 style="font-size:22px;margin:0 0 16px">${escapeHtml(title)}</h1>${body}
<p style="margin:24px 0"><a href="${escapeHtml(link.href)}" style="background:#135244;color:#fff;padding:14px 22px;border-radius:10px;text-decoration:none;font-weight:bold">${escapeHtml(link.label)}</a></p>
<p style="font-size:13px;color:#5d666d">Or paste this address into a browser: ${escapeHtml(link.href)}</p>
</div></body></html>`
}

export function invitationMail(m: { to: string, name: string, shopName: string, role: Role, invitedBy: string, link: string }): OutgoingMail {
  const role = ROLE_LABELS[m.role].toLowerCase()
  const lines = [
    `Hello ${m.name},`,
    `${m.invitedBy} has invited you to ${m.shopName} on Kerfbook as ${role}.`,
    'Open the link to choose your password. It works for 7 days.',
  ]
  return {
    to: m.to,
    subject: `You're invited to ${m.shopName} on Kerfbook`,
    text: `${lines.join('\n\n')}\n\n${m.link}\n`,
    html: layout(`Join ${m.shopName}`, lines, { href: m.link, label: 'Choose a password' }),
  }
}

export function resetMail(m: { to: string, name: string, link: string }): OutgoingMail {
  const lines = [
    `Hello ${m.name},`,
    'Someone asked to reset the password of your Kerfbook account. If it was you, open the link within one hour.',
    'If it was not you, ignore this e-mail: your password stays as it is.',
  ]
  return {
    to: m.to,
    subject: 'Reset your Kerfbook password',
    text: `${lines.join('\n\n')}\n\n${m.link}\n`,
    html: layout('Reset your password', lines, { href: m.link, label: 'Choose a new password' }),
  }
}
