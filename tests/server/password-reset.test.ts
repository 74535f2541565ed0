import type { Express } from 'express'
import type { FakeSmtp } from '../../server/mail/fake-smtp'
import type { Mailer, OutgoingMail } from '../../server/mail/mailer'
import type { TestDatabase } from './helpers'
import { setTimeout as sleep } from 'node:timers/promises'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { appWithMail, register, uniqueEmail } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'

let database: TestDatabase
let app: Express
let smtp: FakeSmtp

beforeAll(async () => {
  database = await createTestDatabase()
  ;({ app, smtp } = await appWithMail(database))
})
afterAll(async () => {
  await smtp.close()
  await database.drop()
})

const ask = (target: Express, email: string) => request(target).post('/api/v1/auth/password-reset/request').send({ email })
const confirm = (token: string, password: string) => request(app).post('/api/v1/auth/password-reset/confirm').send({ token, password })

/** The reset tokens mailed to an address, oldest first, once `count` of them have arrived. */
async function tokensTo(email: string, count: number): Promise<string[]> {
  let tokens: string[] = []
  await vi.waitFor(async () => {
    const mails = (await smtp.mailbox.list()).filter(mail => mail.to.includes(email)).reverse()
    tokens = mails.map(mail => /reset-password\?token=([\w-]{43})/.exec(mail.text)![1]!)
    expect(tokens).toHaveLength(count)
  }, { timeout: 10_000, interval: 50 })
  return tokens
}

describe('reset links', () => {
  it('stop working once a newer one is issued', async () => {
    const account = await register(app, 'Henrike')
    await ask(app, account.email)
    await tokensTo(account.email, 1)
    await ask(app, account.email)
    const [older, newer] = await tokensTo(account.email, 2)

    const refused = await confirm(older!, 'taken over by the older link')
    expect(refused.status).toBe(400)
    expect(refused.body.error.code).toBe('invalid_token')
    expect((await confirm(newer!, 'a brand new passphrase')).status).toBe(204)
  })

  it('stop working once any one of them is used', async () => {
    const account = await register(app, 'Bertil')
    await ask(app, account.email)
    await tokensTo(account.email, 1)
    await ask(app, account.email)
    const [older, newer] = await tokensTo(account.email, 2)
    expect((await confirm(newer!, 'a brand new passphrase')).status).toBe(204)
    expect((await confirm(older!, 'taken over by the older link')).status).toBe(400)
    expect((await request(app).post('/api/v1/auth/login').send({ email: account.email, password: 'a brand new passphrase' })).status).toBe(200)
  })
})

describe('pOST /api/v1/auth/password-reset/request', () => {
  it('answers before the mail is sent, so a slow mail server tells nothing', async () => {
    const account = await register(app, 'Severin')
    const sent: OutgoingMail[] = []
    let release = (): void => {}
    const held = new Promise<void>(resolve => (release = resolve))
    const mailer: Mailer = {
      async send(mail) {
        sent.push(mail)
        await held
      },
      close: () => {},
    }
    const heldApp = buildTestApp(database, { mailer })
    try {
      // Before the fix the answer waited for the mail, so this request would hang.
      const response = await ask(heldApp, account.email).timeout(5_000)
      expect(response.status).toBe(202)
      await vi.waitFor(() => expect(sent.map(mail => mail.to)).toEqual([account.email]), { timeout: 5_000 })
    }
    finally {
      release()
    }
  })

  it('takes as long for an unknown address as for a known one', async () => {
    const known = await register(app, 'Timing')
    const durations = { known: [] as number[], unknown: [] as number[] }
    for (let round = 0; round < 8; round++) {
      for (const [kind, email] of [['known', known.email], ['unknown', uniqueEmail('nobody')]] as const) {
        const started = performance.now()
        expect((await ask(app, email)).status).toBe(202)
        durations[kind].push(performance.now() - started)
        // Lets the previous request's mail go out, so it does not slow down the next one measured.
        await sleep(40)
      }
    }
    const median = (values: number[]): number => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!
    // Sending the mail took about 100 ms; what is left must not tell the two apart.
    expect(Math.abs(median(durations.known) - median(durations.unknown))).toBeLessThan(20)
  })
})
