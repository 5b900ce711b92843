// A local fake SMTP server for development and tests: it accepts every message on loopback,
// keeps it in memory (and as .eml files when given a folder), and shows them on a small web page
// with a JSON feed at /messages.json. Nothing is ever delivered anywhere.
import { mkdir, writeFile } from 'node:fs/promises'
import http from 'node:http'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'

export interface CaughtMail {
  id: number
  receivedAt: string
  from: string
  to: string[]
  subject: string
  text: string
  html: string
  /** Attached files, their bytes in base64. */
  attachments: Array<{ filename: string, contentType: string, contentBase64: string }>
}

export interface MailCatcher {
  smtpPort: number
  httpPort: number
  messages: CaughtMail[]
  close(): Promise<void>
}

const esc = (s: string) => s.replace(/[&<>"]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]!)

export async function startMailCatcher(opts: { smtpPort: number, httpPort: number, dir?: string, host?: string }): Promise<MailCatcher> {
  const host = opts.host ?? '127.0.0.1'
  const messages: CaughtMail[] = []
  // Tests can make the next few deliveries to one address fail, as a real relay sometimes does.
  const failNext = new Map<string, number>()
  if (opts.dir) await mkdir(opts.dir, { recursive: true })

  const smtp = new SMTPServer({
    authOptional: true,
    // The package's bundled certificate has expired: plain SMTP on loopback only.
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      const doomed = session.envelope.rcptTo.map((r) => r.address).find((a) => (failNext.get(a) ?? 0) > 0)
      if (doomed) {
        failNext.set(doomed, failNext.get(doomed)! - 1)
        stream.resume()
        stream.on('end', () => callback(Object.assign(new Error('Temporary failure, try again later'), { responseCode: 451 })))
        return
      }
      const chunks: Buffer[] = []
      stream.on('data', (c: Buffer) => chunks.push(c))
      stream.on('end', async () => {
        try {
          const raw = Buffer.concat(chunks)
          const parsed = await simpleParser(raw)
          const mail: CaughtMail = {
            id: messages.length + 1,
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? '', contentType: a.contentType, contentBase64: a.content.toString('base64') })),
          }
          messages.push(mail)
          if (opts.dir) await writeFile(path.join(opts.dir, `${String(mail.id).padStart(5, '0')}.eml`), raw)
          callback()
        } catch (err) {
          callback(err as Error)
        }
      })
    },
  })

  const web = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', `http://${host}`)
    if (url.pathname === '/messages.json') {
      res.writeHead(200, { 'content-type': 'application/json' })
      res.end(JSON.stringify(messages))
    } else if (url.pathname === '/fail-next' && req.method === 'POST') {
      failNext.set(url.searchParams.get('to') ?? '', Number(url.searchParams.get('count') ?? 1))
      res.writeHead(204).end()
    } else if (url.pathname === '/clear' && req.method === 'POST') {
      messages.length = 0
      res.writeHead(204).end()
    } else if (url.pathname.startsWith('/messages/')) {
      const mail = messages.find((m) => m.id === Number(url.pathname.split('/')[2]))
      if (!mail) return void res.writeHead(404).end('no such message')
      res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' })
      res.end(mail.html || `<pre>${esc(mail.text)}</pre>`)
    } else {
      res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' })
      const rows = [...messages].reverse().map((m) => `<tr><td>${esc(m.receivedAt)}</td><td>${esc(m.to.join(', '))}</td>`
        + `<td><a href="/messages/${m.id}">${esc(m.subject)}</a></td></tr>`).join('')
      res.end(`<!doctype html><meta charset="utf-8"><title>Caught mail</title>`
        + `<body style="font-family:sans-serif;margin:2rem"><h1>Caught mail (${messages.length})</h1>`
        + `<p>Every message the app sends in development lands here; none leaves this machine.</p>`
        + `<table cellpadding="6" border="1" style="border-collapse:collapse"><tr><th>Received (UTC)</th><th>To</th><th>Subject</th></tr>${rows}</table>`)
    }
  })

  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject)
    smtp.listen(opts.smtpPort, host, () => resolve())
  })
  await new Promise<void>((resolve, reject) => {
    web.once('error', reject)
    web.listen(opts.httpPort, host, () => resolve())
  })

  return {
    smtpPort: opts.smtpPort,
    httpPort: opts.httpPort,
    messages,
    close: () => Promise.all([
      new Promise<void>((r) => smtp.close(() => r())),
      new Promise<void>((r) => web.close(() => r())),
    ]).then(() => undefined),
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const smtpPort = Number(process.env.KERFBOOK_SMTP_PORT ?? 2525)
  const httpPort = Number(process.env.KERFBOOK_MAIL_WEB_PORT ?? 2580)
  const dir = process.env.KERFBOOK_MAIL_DIR
  startMailCatcher({ smtpPort, httpPort, dir }).then((c) => {
    console.log(`[mail] catching SMTP on 127.0.0.1:${c.smtpPort}; read caught mail at http://127.0.0.1:${c.httpPort}/`)
    const stop = () => c.close().then(() => process.exit(0))
    process.on('SIGINT', stop)
    process.on('SIGTERM', stop)
  }).catch((err) => {
    console.error('[mail] could not start:', err instanceof Error ? err.message : err)
    process.exit(1)
  })
}
