import type { Transporter } from 'nodemailer'
import nodemailer from 'nodemailer'

/** A file sent with a message (a round's results as CSV). */
export interface MailAttachment {
  filename: string
  content: string | Buffer
  contentType: string
}

export interface OutgoingMail {
  to: string
  subject: string
  text: string
  html?: string
  attachments?: MailAttachment[]
}

export interface Mailer {
  send: (mail: OutgoingMail) => Promise<void>
  close: () => void
}

/**
 * Sends over plain SMTP to the configured host. In this product that host is always the local
 * fake on loopback (see fake-smtp.ts), so nothing leaves the machine.
 */
export function createMailer(options: { host: string, port: number, from: string }): Mailer {
  const transport: Transporter = nodemailer.createTransport({
    host: options.host,
    port: options.port,
    secure: false,
    ignoreTLS: true,
  })
  return {
    async send(mail) {
      await transport.sendMail({ from: options.from, ...mail })
    },
    close: () => transport.close(),
  }
}
