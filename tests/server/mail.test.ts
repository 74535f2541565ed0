import type { FakeSmtp } from '../../server/mail/fake-smtp'
import type { TestDatabase } from './helpers'
import { mkdtempSync, readdirSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startFakeSmtp } from '../../server/mail/fake-smtp'
import { createMailer } from '../../server/mail/mailer'
import { buildTestApp, createTestDatabase } from './helpers'

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
