import type { ConnectionOptions } from 'node:tls'
import type { Transporter } from 'nodemailer'
import type { MailSettings } from '../env'
import nodemailer from 'nodemailer'
import { ConfigError } from '../env'

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

export interface SmtpMailer extends Mailer {
  /** Connects, says hello, upgrades to TLS and signs in as configured; throws a ConfigError naming the setting at fault. */
  verify: () => Promise<void>
}

/** How long a mail server may take to answer before the start gives up on it. */
const defaultAnswerMs = 10_000

/** Beyond the settings: TLS options (a private CA) and how long to wait for each answer. */
export interface MailerExtras { tls?: ConnectionOptions, answerWithinMs?: number }

/**
 * Over SMTP to the configured server: in development the local catcher on loopback (fake-smtp.ts),
 * in production the team's mail provider, with TLS from the first byte (`secure`) or upgraded by
 * STARTTLS, which is then required whenever a password is sent.
 */
export function createMailer(options: Pick<MailSettings, 'host' | 'port' | 'from'> & Partial<MailSettings> & MailerExtras): SmtpMailer {
  const answerWithinMs = options.answerWithinMs ?? defaultAnswerMs
  const auth = options.user ? { user: options.user, pass: options.password ?? '' } : undefined
  const transport: Transporter = nodemailer.createTransport({
    host: options.host,
    port: options.port,
    secure: options.secure ?? false,
    // Without a password there is nothing to protect (the catcher speaks plain SMTP only).
    ...(auth ? { auth, requireTLS: !options.secure } : { ignoreTLS: !options.secure }),
    connectionTimeout: answerWithinMs,
    greetingTimeout: answerWithinMs,
    socketTimeout: answerWithinMs * 3,
    ...(options.tls ? { tls: options.tls } : {}),
  })
  return {
    async send(mail) {
      await transport.sendMail({ from: options.from, ...mail })
    },
    async verify() {
      try {
        await transport.verify()
      }
      catch (error) {
        throw new ConfigError(mailProblem(error as NodeJS.ErrnoException & { responseCode?: number }, options))
      }
    },
    close: () => transport.close(),
  }
}

/** One line saying which mail setting to look at, from what nodemailer reported. */
export function mailProblem(error: NodeJS.ErrnoException & { responseCode?: number, command?: string }, options: Pick<MailSettings, 'host' | 'port'> & Partial<MailSettings>): string {
  const where = `${options.host}:${options.port}`
  const said = error.message.split('\n')[0] ?? ''
  const code = error.code ?? ''
  if (code === 'EAUTH' || error.responseCode === 535)
    return `Mail: ${where} refused the sign-in of SMTP_USER "${options.user ?? ''}": check SMTP_USER and SMTP_PASSWORD (${said}).`
  if (code === 'EDNS' || /ENOTFOUND|EAI_AGAIN/.test(said))
    return `Mail: SMTP_HOST "${options.host}" is not a host name this machine can find (${said}).`
  if (/ECONNREFUSED/.test(said) || code === 'ECONNREFUSED')
    return `Mail: nothing accepts connections at ${where}: check SMTP_HOST and SMTP_PORT (${said}).`
  if (/wrong version number|ssl3_get_record|packet length too long|EPROTO/i.test(said) || (options.secure && code === 'ETIMEDOUT'))
    return `Mail: ${where} does not speak TLS from the first byte: set SMTP_SECURE=false for a port that upgrades with STARTTLS (587), or use the server's TLS port (465) (${said}).`
  if (code === 'ETIMEDOUT' || /Greeting never received/i.test(said))
    return `Mail: ${where} never greeted: if it expects TLS from the first byte (port 465), set SMTP_SECURE=true; else check SMTP_HOST and SMTP_PORT (${said}).`
  if (/STARTTLS/i.test(said) || error.command === 'STARTTLS')
    return `Mail: ${where} offers no STARTTLS, so SMTP_PASSWORD would travel unencrypted: use the server's TLS port with SMTP_SECURE=true (${said}).`
  if (code === 'ESOCKET' && /certificate|self.signed|unable to verify/i.test(said))
    return `Mail: the TLS certificate of ${where} is not trusted: check SMTP_HOST is the name on the server's certificate (${said}).`
  return `Mail: ${where} could not be used (SMTP_HOST, SMTP_PORT, SMTP_SECURE, SMTP_USER): ${said}.`
}
