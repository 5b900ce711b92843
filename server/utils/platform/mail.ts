// Outgoing e-mail over SMTP through nodemailer. Development and tests point it at the local
// mail catcher (scripts/mail-catcher.ts); production at the shop's real relay.
import nodemailer, { type Transporter } from 'nodemailer'

let transport: Transporter | undefined

export interface OutgoingMail {
  to: string | string[]
  subject: string
  text: string
  html: string
  /** Where replies go: the shop's own address for mail to suppliers. */
  replyTo?: string
  /** A fixed Message-ID lets mail systems drop a copy sent twice. */
  messageId?: string
  attachments?: Array<{ filename: string, content: Buffer, contentType: string }>
}

function useTransport(): { transport: Transporter, from: string } {
  const { smtp } = useRuntimeConfig()
  if (!smtp.host || !smtp.port) {
    throw createError({
      statusCode: 503,
      statusMessage: 'E-mail is not set up on this server: set NUXT_SMTP_HOST and NUXT_SMTP_PORT.',
    })
  }
  transport ??= nodemailer.createTransport({
    host: smtp.host,
    port: Number(smtp.port),
    secure: Boolean(smtp.secure),
    // The development catcher speaks plain SMTP on loopback.
    ignoreTLS: !smtp.secure && ['127.0.0.1', 'localhost', '::1'].includes(smtp.host),
    auth: smtp.user ? { user: smtp.user, pass: smtp.pass } : undefined,
  })
  return { transport, from: smtp.from || 'Kerfbook <kerfbook@localhost>' }
}

export async function sendMail(mail: OutgoingMail): Promise<void> {
  const { transport, from } = useTransport()
  await transport.sendMail({ from, ...mail })
}

/** Minimal HTML escaping for the e-mail templates. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)
}
