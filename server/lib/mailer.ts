import nodemailer from 'nodemailer'

export interface MailAttachment {
  filename: string
  content: Buffer
  contentType: string
}
export interface MailMessage {
  to: string
  subject: string
  text: string
  attachments?: MailAttachment[]
}
export interface Mailer {
  send(message: MailMessage): Promise<{ messageId: string }>
}

export interface SmtpSettings {
  host: string
  port: number
  secure: boolean
  user?: string
  pass?: string
  from: string
}

/** Sends through any SMTP relay with nodemailer; the local fake in the demo, a real relay in production. */
export function createMailer(settings: SmtpSettings): Mailer {
  const transport = nodemailer.createTransport({
    host: settings.host,
    port: settings.port,
    secure: settings.secure,
    ignoreTLS: !settings.secure && (settings.host === '127.0.0.1' || settings.host === 'localhost'),
    auth: settings.user ? { user: settings.user, pass: settings.pass ?? '' } : undefined,
  })
  return {
    async send(message) {
      const info = await transport.sendMail({ from: settings.from, ...message })
      return { messageId: String(info.messageId) }
    },
  }
}
