import type { AddressObject } from 'mailparser'
import { randomBytes } from 'node:crypto'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import { Mailbox } from './mailbox'

export interface FakeSmtp {
  port: number
  mailbox: Mailbox
  close: () => Promise<void>
}

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  return (Array.isArray(field) ? field : field ? [field] : [])
    .flatMap(group => group.value.map(entry => (entry.address ?? '').toLowerCase()))
    .filter(Boolean)
}

/** A sortable id: time first, then randomness, so names order by arrival. */
const mailId = (): string => `${Date.now().toString(36).padStart(9, '0')}-${randomBytes(4).toString('hex')}`

/**
 * A local SMTP server on loopback that accepts every message and keeps it in `mailDir`. It is the
 * only place Lixivia's e-mail goes: no relay, no delivery.
 */
export async function startFakeSmtp(options: { port: number, mailDir: string, host?: string }): Promise<FakeSmtp> {
  const mailbox = new Mailbox(options.mailDir)
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Lixivia local mail catcher',
    size: 5 * 1024 * 1024,
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (chunk: Buffer) => chunks.push(chunk))
      stream.on('error', callback)
      stream.on('end', () => {
        const raw = Buffer.concat(chunks)
        simpleParser(raw)
          .then(parsed => mailbox.save({
            id: mailId(),
            receivedAt: new Date().toISOString(),
            from: addresses(parsed.from)[0] ?? '',
            to: addresses(parsed.to),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : undefined,
            attachments: parsed.attachments.map(file => ({ filename: file.filename ?? '', contentType: file.contentType, size: file.size, content: file.content.toString('base64') })),
          }, raw))
          .then(() => callback(), callback)
      })
    },
  })
  const host = options.host ?? '127.0.0.1'
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(options.port, host, () => {
      server.off('error', reject)
      resolve()
    })
  })
  const address = server.server.address()
  const port = typeof address === 'object' && address ? address.port : options.port
  return {
    port,
    mailbox,
    close: () => new Promise(resolve => server.close(() => resolve())),
  }
}
