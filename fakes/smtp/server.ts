import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'

export interface ReceivedMail {
  id: number
  receivedAt: string
  from: string
  to: string[]
  subject: string
  text: string
  attachments: { filename: string; contentType: string; size: number }[]
}

export interface SmtpFake {
  smtpPort: number
  webPort: number
  messages: ReceivedMail[]
  close(): Promise<void>
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`)
}

/**
 * A local SMTP server that keeps every message it receives and shows them on a small inbox page
 * (GET / as HTML, GET /messages as JSON, DELETE /messages to clear). Stands in for a mail relay.
 */
export async function startSmtpFake(options: { smtpPort: number; webPort: number; host?: string }): Promise<SmtpFake> {
  const host = options.host ?? '127.0.0.1'
  const messages: ReceivedMail[] = []
  let nextId = 1
  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 25 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const to = session.envelope.rcptTo.map((r) => r.address)
          messages.push({
            id: nextId++,
            receivedAt: new Date().toISOString(),
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to,
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            attachments: mail.attachments.map((a) => ({ filename: a.filename ?? 'attachment', contentType: a.contentType, size: a.size })),
          })
          if (messages.length > 500) messages.shift()
          callback()
        })
        .catch((err: Error) => callback(err))
    },
  })
  await new Promise<void>((res, rej) => {
    smtp.once('error', rej)
    smtp.listen(options.smtpPort, host, () => res())
  })
  const web: Server = createServer((req, res) => {
    if (req.url === '/messages' && req.method === 'GET') {
      res.setHeader('content-type', 'application/json')
      res.end(JSON.stringify(messages))
      return
    }
    if (req.url === '/messages' && req.method === 'DELETE') {
      messages.length = 0
      res.statusCode = 204
      res.end()
      return
    }
    res.setHeader('content-type', 'text/html; charset=utf-8')
    const rows = messages
      .slice()
      .reverse()
      .map(
        (m) =>
          `<article><h2>${escapeHtml(m.subject)}</h2><p><b>To:</b> ${escapeHtml(m.to.join(', '))} · <b>From:</b> ${escapeHtml(m.from)} · ${m.receivedAt}</p>` +
          `<pre>${escapeHtml(m.text)}</pre>${m.attachments.map((a) => `<p>📎 ${escapeHtml(a.filename)} (${a.contentType}, ${a.size} bytes)</p>`).join('')}</article>`,
      )
      .join('<hr>')
    res.end(
      `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Fillwright local mailbox</title>` +
        `<style>body{font-family:system-ui;max-width:56rem;margin:2rem auto;padding:0 1rem}pre{white-space:pre-wrap;background:#f4f4f5;padding:.75rem}</style></head>` +
        `<body><h1>Local mailbox (${messages.length})</h1><p>Everything the app sends while it points at this fake lands here. Nothing leaves this machine.</p>${rows || '<p>No messages yet.</p>'}</body></html>`,
    )
  })
  await new Promise<void>((res) => web.listen(options.webPort, host, () => res()))
  return {
    smtpPort: (smtp.server.address() as AddressInfo).port,
    webPort: (web.address() as AddressInfo).port,
    messages,
    close: () =>
      new Promise<void>((res) => {
        web.close()
        smtp.close(() => res())
      }),
  }
}
