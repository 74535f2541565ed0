import type { Express } from 'express'
import type { FakeSmtp } from '../../server/mail/fake-smtp'
import type { TestDatabase } from './helpers'
import { mkdtempSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import request from 'supertest'
import { startFakeSmtp } from '../../server/mail/fake-smtp'
import { createMailer } from '../../server/mail/mailer'
import { buildTestApp } from './helpers'

/** The app with its mail going to a fake SMTP server of the test's own. */
export async function appWithMail(database: TestDatabase, overrides: Parameters<typeof buildTestApp>[1] = {}): Promise<{ app: Express, smtp: FakeSmtp }> {
  const smtp = await startFakeSmtp({ port: 0, mailDir: mkdtempSync(path.join(os.tmpdir(), 'lixivia-test-mail-')) })
  const mailer = createMailer({ host: '127.0.0.1', port: smtp.port, from: 'Lixivia <no-reply@lixivia.test>' })
  return { app: buildTestApp(database, { mailer, ...overrides }), smtp }
}

export interface Account { id: string, email: string, token: string, cookie: string }

let counter = 0
/** A fresh unique address on the reserved .test domain. */
export const uniqueEmail = (name: string): string => `${name}.${Date.now().toString(36)}${(counter++).toString(36)}@kestrel-quay.test`

/** Every Set-Cookie header of a response. */
export const setCookies = (response: request.Response): string[] => ([] as string[]).concat(response.headers['set-cookie'] ?? [])

/** The refresh cookie (name=value) from a response. */
export function refreshCookie(response: request.Response): string {
  const cookie = setCookies(response).find(value => value.startsWith('lixivia_refresh='))
  if (!cookie)
    throw new Error('no refresh cookie in the response')
  return cookie.split(';')[0]!
}

export async function register(app: Express, name: string, email = uniqueEmail(name.toLowerCase())): Promise<Account> {
  const response = await request(app).post('/api/v1/auth/register').send({ email, password: 'long enough password', name })
  if (response.status !== 201)
    throw new Error(`register failed: ${response.status} ${JSON.stringify(response.body)}`)
  return { id: response.body.user.id, email, token: response.body.accessToken, cookie: refreshCookie(response) }
}

export const bearer = (account: Pick<Account, 'token'>): [string, string] => ['Authorization', `Bearer ${account.token}`]
