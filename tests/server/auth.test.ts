import type { Express } from 'express'
import type { FakeSmtp } from '../../server/mail/fake-smtp'
import type { TestDatabase } from './helpers'
import { and, eq, isNotNull } from 'drizzle-orm'
import { SignJWT } from 'jose'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { accessTokenAudience, accessTokenIssuer } from '../../server/auth/tokens'
import { auditLog, passwordResets, refreshTokens, users } from '../../server/db/schema'
import { refreshGraceMs } from '../../server/services/auth.service'
import { appWithMail, bearer, refreshCookie, register, setCookies, uniqueEmail } from './auth-helpers'
import { buildTestApp, createTestDatabase, testJwtSecret } from './helpers'

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

async function actions(subjectId: string): Promise<string[]> {
  return (await database.db.select({ action: auditLog.action }).from(auditLog).where(eq(auditLog.subjectId, subjectId))).map(row => row.action)
}

describe('pOST /api/v1/auth/register', () => {
  it('creates the account, answers 201 with the user and an access token, and sets the refresh cookie', async () => {
    const email = uniqueEmail('noor')
    const response = await request(app).post('/api/v1/auth/register').send({ email: email.toUpperCase(), password: 'copper kettle 42', name: 'Noor Halloran' })
    expect(response.status).toBe(201)
    expect(response.body.user).toMatchObject({ email, name: 'Noor Halloran' })
    expect(response.body.accessToken.split('.')).toHaveLength(3)
    const cookie = setCookies(response)[0]!
    expect(cookie).toMatch(/^lixivia_refresh=[\w-]{43};/)
    expect(cookie).toContain('Path=/api/v1/auth')
    expect(cookie).toContain('HttpOnly')
    expect(cookie).toContain('SameSite=Strict')
    expect(cookie).toContain('Max-Age=2592000')
    // Loopback: browsers refuse Secure cookies on plain http://127.0.0.1.
    expect(cookie).not.toContain('Secure')
    expect(await actions(response.body.user.id)).toContain('auth.registered')
  })

  it('marks the cookie Secure outside loopback', async () => {
    const response = await request(app).post('/api/v1/auth/register').set('Host', 'crew.lixivia.test').send({ email: uniqueEmail('secure'), password: 'copper kettle 42', name: 'Away Host' })
    expect(setCookies(response)[0]).toContain('Secure')
  })

  it('answers 409 for an e-mail that already has an account, whatever its case', async () => {
    const { email } = await register(app, 'Edda')
    const response = await request(app).post('/api/v1/auth/register').send({ email: email.toUpperCase(), password: 'another long one', name: 'Edda Two' })
    expect(response.status).toBe(409)
    expect(response.body.error.code).toBe('email_taken')
  })

  it.each([
    [{ password: 'short' }, 'password'],
    [{ password: 'SAME@kestrel-quay.test', email: 'same@kestrel-quay.test' }, 'password'],
    [{ email: 'not-an-address' }, 'email'],
    [{ name: 'x'.repeat(121) }, 'name'],
    [{ name: 42 }, 'name'],
    [{ name: 'Noor \uD800' }, 'name'],
    [{ password: 'long enough \uDC00 password' }, 'password'],
    [{ password: 'long enough \u0000 password' }, 'password'],
    [{ role: 'owner' }, 'role'],
  ])('answers 400 naming the field for %o', async (change, field) => {
    const body = { email: uniqueEmail('bad'), password: 'long enough password', name: 'Bad Input', ...change }
    const response = await request(app).post('/api/v1/auth/register').send(body)
    expect(response.status).toBe(400)
    expect(JSON.stringify(response.body.error)).toContain(field)
  })

  it('stores and shows SQL-looking text verbatim', async () => {
    const name = 'Robert\'); DROP TABLE users;--'
    const account = await register(app, name, uniqueEmail('bobby'))
    const me = await request(app).get('/api/v1/me').set(...bearer(account))
    expect(me.body.user.name).toBe(name)
  })
})

describe('pOST /api/v1/auth/login', () => {
  it('signs in with the right password', async () => {
    const { email, id } = await register(app, 'Wren')
    const response = await request(app).post('/api/v1/auth/login').send({ email, password: 'long enough password' })
    expect(response.status).toBe(200)
    expect(response.body.user.email).toBe(email)
    expect(refreshCookie(response)).toMatch(/^lixivia_refresh=/)
    expect(await actions(id)).toContain('auth.signed_in')
  })

  it('gives the same 401 for a wrong password and an unknown e-mail', async () => {
    const { email, id } = await register(app, 'Osric')
    const wrong = await request(app).post('/api/v1/auth/login').send({ email, password: 'not the password' })
    const unknown = await request(app).post('/api/v1/auth/login').send({ email: uniqueEmail('nobody'), password: 'not the password' })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(wrong.body).toEqual(unknown.body)
    expect(await actions(id)).toContain('auth.login_failed')
  })
})

describe('pOST /api/v1/auth/refresh', () => {
  it('rotates the refresh token and issues a new access token', async () => {
    const account = await register(app, 'Tamsin')
    const first = await request(app).post('/api/v1/auth/refresh').set('Cookie', account.cookie)
    expect(first.status).toBe(200)
    expect(first.body.accessToken).toBeTruthy()
    expect(refreshCookie(first)).not.toBe(account.cookie)
    const second = await request(app).post('/api/v1/auth/refresh').set('Cookie', refreshCookie(first))
    expect(second.status).toBe(200)
  })

  it('revokes the whole family when a used token comes back after the grace', async () => {
    const account = await register(app, 'Ilse')
    const rotated = await request(app).post('/api/v1/auth/refresh').set('Cookie', account.cookie)
    await database.db.update(refreshTokens).set({ usedAt: new Date(Date.now() - refreshGraceMs - 1000) }).where(and(eq(refreshTokens.userId, account.id), isNotNull(refreshTokens.usedAt)))
    const stolen = await request(app).post('/api/v1/auth/refresh').set('Cookie', account.cookie)
    expect(stolen.status).toBe(401)
    // The legitimate, newer token of the same sign-in is dead too.
    const after = await request(app).post('/api/v1/auth/refresh').set('Cookie', refreshCookie(rotated))
    expect(after.status).toBe(401)
    expect(await actions(account.id)).toContain('auth.refresh_reused')
  })

  it('answers 401 with no cookie or an unknown one', async () => {
    expect((await request(app).post('/api/v1/auth/refresh')).status).toBe(401)
    expect((await request(app).post('/api/v1/auth/refresh').set('Cookie', `lixivia_refresh=${'a'.repeat(43)}`)).status).toBe(401)
  })
})

describe('pOST /api/v1/auth/logout', () => {
  it('revokes the refresh token and clears the cookie', async () => {
    const account = await register(app, 'Gideon')
    const out = await request(app).post('/api/v1/auth/logout').set('Cookie', account.cookie)
    expect(out.status).toBe(204)
    expect(setCookies(out)[0]).toMatch(/^lixivia_refresh=;/)
    expect((await request(app).post('/api/v1/auth/refresh').set('Cookie', account.cookie)).status).toBe(401)
  })
})

describe('access tokens', () => {
  const key = new Uint8Array(Buffer.from(testJwtSecret, 'base64url'))
  const encode = (value: object) => Buffer.from(JSON.stringify(value)).toString('base64url')
  let account: Awaited<ReturnType<typeof register>>
  beforeAll(async () => {
    account = await register(app, 'Marit')
  })

  const sign = (header: Record<string, string>, claims: { aud?: string, exp?: number | string, iss?: string }, signingKey = key) => {
    let jwt = new SignJWT({}).setProtectedHeader({ alg: 'HS256', ...header }).setSubject(account.id).setIssuedAt()
    jwt = jwt.setIssuer(claims.iss ?? accessTokenIssuer).setAudience(claims.aud ?? accessTokenAudience)
    if (claims.exp !== undefined)
      jwt = jwt.setExpirationTime(claims.exp)
    return jwt.sign(signingKey)
  }

  it('lets a valid token through', async () => {
    expect((await request(app).get('/api/v1/me').set(...bearer(account))).status).toBe(200)
  })

  it.each([
    ['no token', async () => ''],
    ['alg none', async () => `${encode({ alg: 'none', typ: 'at+jwt' })}.${encode({ sub: account.id, iss: accessTokenIssuer, aud: accessTokenAudience, exp: Math.floor(Date.now() / 1000) + 600, iat: Math.floor(Date.now() / 1000) })}.`],
    ['a wrong key', async () => sign({ typ: 'at+jwt' }, { exp: '10m' }, new Uint8Array(32).fill(9))],
    ['a wrong audience', async () => sign({ typ: 'at+jwt' }, { exp: '10m', aud: 'someone-else' })],
    ['a wrong issuer', async () => sign({ typ: 'at+jwt' }, { exp: '10m', iss: 'elsewhere' })],
    ['an expired token', async () => sign({ typ: 'at+jwt' }, { exp: Math.floor(Date.now() / 1000) - 60 })],
    ['no expiry at all', async () => sign({ typ: 'at+jwt' }, {})],
    ['another kind of JWT (typ JWT)', async () => sign({ typ: 'JWT' }, { exp: '10m' })],
    ['a tampered payload', async () => {
      const [header, , signature] = account.token.split('.')
      return `${header}.${encode({ sub: 'someone-else', iss: accessTokenIssuer, aud: accessTokenAudience, exp: Math.floor(Date.now() / 1000) + 600 })}.${signature}`
    }],
  ])('refuses %s with 401', async (_name, make) => {
    const token = await make()
    const response = await request(app).get('/api/v1/me').set('Authorization', `Bearer ${token}`)
    expect(response.status).toBe(401)
    expect(response.body.error.code).toBe('unauthenticated')
  })

  it('expires 15 minutes after it is issued', async () => {
    const [, payload] = account.token.split('.')
    const claims = JSON.parse(Buffer.from(payload!, 'base64url').toString())
    expect(claims.exp - claims.iat).toBe(15 * 60)
    expect(JSON.parse(Buffer.from(account.token.split('.')[0]!, 'base64url').toString())).toEqual({ alg: 'HS256', typ: 'at+jwt' })
  })
})

describe('password reset', () => {
  it('always answers 202, and mails a one-time link only to a known address', async () => {
    const unknown = uniqueEmail('ghost')
    expect((await request(app).post('/api/v1/auth/password-reset/request').send({ email: unknown })).status).toBe(202)
    const account = await register(app, 'Perpetua')
    expect((await request(app).post('/api/v1/auth/password-reset/request').send({ email: account.email })).status).toBe(202)
    const mail = await smtp.mailbox.waitFor(account.email)
    expect(mail.subject).toBe('Reset your Lixivia password')
    expect((await smtp.mailbox.list()).some(m => m.to.includes(unknown))).toBe(false)

    const token = /reset-password\?token=([\w-]{43})/.exec(mail.text)![1]!
    const confirm = await request(app).post('/api/v1/auth/password-reset/confirm').send({ token, password: 'a brand new passphrase' })
    expect(confirm.status).toBe(204)
    expect((await request(app).post('/api/v1/auth/login').send({ email: account.email, password: 'long enough password' })).status).toBe(401)
    expect((await request(app).post('/api/v1/auth/login').send({ email: account.email, password: 'a brand new passphrase' })).status).toBe(200)
    // Every session from before the reset is gone.
    expect((await request(app).post('/api/v1/auth/refresh').set('Cookie', account.cookie)).status).toBe(401)
    // The link works once.
    const again = await request(app).post('/api/v1/auth/password-reset/confirm').send({ token, password: 'yet another passphrase' })
    expect(again.status).toBe(400)
    expect(again.body.error.code).toBe('invalid_token')
    expect(await actions(account.id)).toEqual(expect.arrayContaining(['password_reset.requested', 'password_reset.completed']))
  })

  it('refuses a link older than an hour', async () => {
    const account = await register(app, 'Cassius')
    await request(app).post('/api/v1/auth/password-reset/request').send({ email: account.email })
    const token = /token=([\w-]{43})/.exec((await smtp.mailbox.waitFor(account.email)).text)![1]!
    await database.db.update(passwordResets).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(passwordResets.userId, account.id))
    expect((await request(app).post('/api/v1/auth/password-reset/confirm').send({ token, password: 'a brand new passphrase' })).status).toBe(400)
  })

  it('never stores the password or the token in the clear', async () => {
    const account = await register(app, 'Lisander')
    const [row] = await database.db.select().from(users).where(eq(users.id, account.id))
    expect(row!.passwordHash).not.toContain('long enough password')
    expect(row!.passwordHash).toMatch(/^\$argon2id\$/)
  })
})

describe('rate limiting', () => {
  it('answers 429 with Retry-After after too many sign-in attempts', async () => {
    const limited = buildTestApp(database, { rateLimits: { login: { limit: 2, windowMs: 60_000 } } })
    const attempt = () => request(limited).post('/api/v1/auth/login').send({ email: uniqueEmail('guess'), password: 'guessing again' })
    expect((await attempt()).status).toBe(401)
    expect((await attempt()).status).toBe(401)
    const third = await attempt()
    expect(third.status).toBe(429)
    expect(Number(third.headers['retry-after'])).toBeGreaterThan(0)
    expect(third.body.error.code).toBe('rate_limited')
  })
})
