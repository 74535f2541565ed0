import type { FakeSmtp } from '../../server/mail/fake-smtp'
import type { TestDatabase } from './helpers'
import { mkdtempSync, readdirSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { mailNotice } from '../../scripts/lib/stack'
import { freePort } from '../../scripts/lib/system'
import { parseEnv, servesDevMail } from '../../server/env'
import { serve } from '../../server/index'
import { startFakeSmtp } from '../../server/mail/fake-smtp'
import { createMailer } from '../../server/mail/mailer'
import { buildTestApp, createTestDatabase, testJwtSecret } from './helpers'

let smtp: FakeSmtp
let mailDir: string
let database: TestDatabase

beforeAll(async () => {
  mailDir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-mail-'))
  smtp = await startFakeSmtp({ port: 0, mailDir })
  database = await createTestDatabase()
})
afterAll(async () => {
  await smtp.close()
  await database.drop()
  rmSync(mailDir, { recursive: true, force: true })
})

describe('the local fake SMTP server', () => {
  it('keeps what nodemailer sends, parsed, under the mail folder', async () => {
    const mailer = createMailer({ host: '127.0.0.1', port: smtp.port, from: 'Lixivia <no-reply@lixivia.test>' })
    await mailer.send({ to: 'Tobiah@Kestrel-Quay.test', subject: 'Round 2 results', text: 'Cup 7: 1.38 %TDS, 20.4 %EY' })
    mailer.close()

    const mail = await smtp.mailbox.waitFor('tobiah@kestrel-quay.test')
    expect(mail).toMatchObject({ from: 'no-reply@lixivia.test', subject: 'Round 2 results' })
    expect(mail.text).toContain('1.38 %TDS')
    expect(readdirSync(mailDir).filter(name => name.startsWith(mail.id)).sort()).toEqual([`${mail.id}.eml`, `${mail.id}.json`])
  })
})

describe('gET /api/v1/dev/mail', () => {
  it('lists the caught messages in development', async () => {
    const app = buildTestApp(database, { devMailbox: smtp.mailbox })
    const list = await request(app).get('/api/v1/dev/mail')
    expect(list.status).toBe(200)
    expect(list.body.mails[0]).toMatchObject({ subject: 'Round 2 results', to: ['tobiah@kestrel-quay.test'] })

    const one = await request(app).get(`/api/v1/dev/mail/${list.body.mails[0].id}`)
    expect(one.body.text).toContain('20.4 %EY')
    const missing = await request(app).get('/api/v1/dev/mail/nope-0000')
    expect(missing.status).toBe(404)
  })

  it('does not exist when no dev mailbox is given (production)', async () => {
    const response = await request(buildTestApp(database)).get('/api/v1/dev/mail')
    expect(response.status).toBe(404)
  })
})

describe('servesDevMail', () => {
  it.each([
    ['development', '127.0.0.1', true],
    ['test', '::1', true],
    ['development', 'localhost', true],
    ['development', '0.0.0.0', false],
    ['development', '::', false],
    ['development', '192.168.4.20', false],
    ['development', 'crew.lixivia.test', false],
    ['production', '127.0.0.1', false],
  ] as const)('with NODE_ENV %s and HOST %s is %s', (NODE_ENV, HOST, expected) => {
    expect(servesDevMail({ NODE_ENV, HOST })).toBe(expected)
  })
})

describe('mailNotice', () => {
  const smtp = { port: 2526, dir: 'data/mail' }
  it('gives the listing\'s address on loopback in development', () => {
    expect(mailNotice({ NODE_ENV: 'development', HOST: '127.0.0.1' }, smtp, 'http://127.0.0.1:8080/')).toContain('listed at http://127.0.0.1:8080/api/v1/dev/mail')
  })

  it.each([['development', '0.0.0.0'], ['production', '127.0.0.1']] as const)('points to the mail folder instead with NODE_ENV %s and HOST %s', (NODE_ENV, HOST) => {
    const notice = mailNotice({ NODE_ENV, HOST }, smtp, `http://${HOST}:8080/`)
    expect(notice).toContain('kept in data/mail')
    expect(notice).toContain('read the files there')
    expect(notice).not.toContain('listed at')
  })
})

describe('the mail listing of a running server', () => {
  async function listingStatus(host: string): Promise<number> {
    const port = await freePort()
    const env = parseEnv({ DATABASE_URL: database.url, JWT_SECRET: testJwtSecret, NODE_ENV: 'development', HOST: host, PORT: String(port), DATA_DIR: mailDir, LOG_LEVEL: 'silent' })
    const running = await serve(env)
    try {
      return (await fetch(`http://127.0.0.1:${port}/api/v1/dev/mail`)).status
    }
    finally {
      await running.close()
    }
  }

  it('is served while the app listens on loopback only', async () => {
    expect(await listingStatus('127.0.0.1')).toBe(200)
  })

  it('is not served when the app listens on every interface, whoever asks', async () => {
    expect(await listingStatus('0.0.0.0')).toBe(404)
  })
})
