import type { SMTPServerOptions } from 'smtp-server'
import type { MailerExtras } from '../../server/mail/mailer'
import { execFileSync } from 'node:child_process'
import { mkdtempSync, readFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { SMTPServer } from 'smtp-server'
import { afterEach, describe, expect, it } from 'vitest'
import { freePort } from '../../scripts/lib/system'
import { ConfigError, parseEnv } from '../../server/env'
import { serve } from '../../server/index'
import { createMailer } from '../../server/mail/mailer'
import { testJwtSecret } from './helpers'

// A mail provider stand-in: smtp-server on loopback with a certificate of our own for 127.0.0.1,
// sign-in required, and the messages it accepted kept for the test.

const certDir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-smtp-tls-'))
execFileSync('openssl', ['req', '-x509', '-newkey', 'rsa:2048', '-nodes', '-days', '2', '-subj', '/CN=127.0.0.1', '-addext', 'subjectAltName=IP:127.0.0.1', '-keyout', path.join(certDir, 'key.pem'), '-out', path.join(certDir, 'cert.pem')], { stdio: 'ignore' })
const key = readFileSync(path.join(certDir, 'key.pem'))
const cert = readFileSync(path.join(certDir, 'cert.pem'))
const trusted: MailerExtras = { tls: { ca: cert }, answerWithinMs: 1_500 }

interface Provider { port: number, accepted: { user: string | undefined, to: string[] }[] }
const running: SMTPServer[] = []
afterEach(async () => {
  await Promise.all(running.splice(0).map(server => new Promise<void>(resolve => server.close(() => resolve()))))
})

async function provider(options: SMTPServerOptions): Promise<Provider> {
  const accepted: Provider['accepted'] = []
  const server = new SMTPServer({
    key,
    cert,
    logger: false,
    onAuth: (auth, _session, callback) => (auth.username === 'crew' && auth.password === 'right horse battery'
      ? callback(null, { user: auth.username })
      : callback(new Error('Invalid username or password'))),
    onData(stream, session, callback) {
      stream.resume()
      stream.on('end', () => {
        accepted.push({ user: typeof session.user === 'string' ? session.user : undefined, to: session.envelope.rcptTo.map(r => r.address) })
        callback()
      })
    },
    ...options,
  })
  // A client speaking plain SMTP to the TLS port is the point of one case; the server's complaint is not.
  server.on('error', () => {})
  running.push(server)
  const port = await freePort()
  await new Promise<void>(resolve => server.listen(port, '127.0.0.1', resolve))
  return { port, accepted }
}

const settings = (port: number, extra: Record<string, unknown> = {}) => ({ host: '127.0.0.1', port, from: 'Lixivia <crew@kestrel-quay.test>', user: 'crew', password: 'right horse battery', ...trusted, ...extra })

describe('the mailer on a real SMTP server', () => {
  it('signs in over TLS from the first byte and sends', async () => {
    const tls = await provider({ secure: true })
    const mailer = createMailer(settings(tls.port, { secure: true }))
    await mailer.verify()
    await mailer.send({ to: 'wren@kestrel-quay.test', subject: 'Invitation', text: 'Join us' })
    mailer.close()
    expect(tls.accepted).toEqual([{ user: 'crew', to: ['wren@kestrel-quay.test'] }])
  })

  it('signs in after STARTTLS on a submission port', async () => {
    const submission = await provider({})
    const mailer = createMailer(settings(submission.port, { secure: false }))
    await mailer.verify()
    mailer.close()
  })

  it.each([
    ['a wrong password', async () => settings((await provider({ secure: true })).port, { secure: true, password: 'wrong' }), /SMTP_USER and SMTP_PASSWORD/],
    ['nothing listening', async () => settings(await freePort(), { secure: true }), /check SMTP_HOST and SMTP_PORT/],
    ['TLS expected from a plain server', async () => settings((await provider({ disabledCommands: ['STARTTLS'], allowInsecureAuth: true })).port, { secure: true }), /SMTP_SECURE=false/],
    ['plain SMTP sent to a TLS port', async () => settings((await provider({ secure: true })).port, { secure: false }), /SMTP_SECURE=true/],
    ['a password that would travel unencrypted', async () => settings((await provider({ disabledCommands: ['STARTTLS'], allowInsecureAuth: true })).port, { secure: false }), /offers no STARTTLS/],
    ['a host name nobody knows', async () => settings(25, { host: 'mail.nowhere.invalid' }), /SMTP_HOST "mail.nowhere.invalid"/],
  ])('names the setting to fix for %s', async (_case, make, message) => {
    const mailer = createMailer(await make())
    const failure = mailer.verify()
    await expect(failure).rejects.toBeInstanceOf(ConfigError)
    await expect(failure).rejects.toThrow(message)
    mailer.close()
  })
})

describe('the start in production', () => {
  it('stops with the mail setting at fault before it listens', async () => {
    const port = await freePort()
    const env = parseEnv({ NODE_ENV: 'production', DATABASE_URL: 'mysql://u:p@127.0.0.1:9/none', JWT_SECRET: testJwtSecret, PORT: String(port), SMTP_HOST: '127.0.0.1', SMTP_PORT: String(await freePort()), MAIL_FROM: 'Lixivia <crew@kestrel-quay.test>', LOG_LEVEL: 'silent' })
    await expect(serve(env, { checkServices: true })).rejects.toThrow(/Mail: nothing accepts connections at 127\.0\.0\.1:\d+: check SMTP_HOST and SMTP_PORT/)
    await expect(fetch(`http://127.0.0.1:${port}/`)).rejects.toThrow()
  })
})
