import type { Express } from 'express'
import type { Account } from './auth-helpers'
import type { TestDatabase } from './helpers'
import { eq } from 'drizzle-orm'
import { SignJWT } from 'jose'
import request from 'supertest'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { accessTokenAudience, accessTokenIssuer, accessTokenType } from '../../server/auth/tokens'
import { users } from '../../server/db/schema'
import { bearer, register } from './auth-helpers'
import { buildTestApp, createTestDatabase, testJwtSecret } from './helpers'
import { instrument, put } from './sync-helpers'

let database: TestDatabase
let app: Express

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
})
afterAll(async () => {
  await database.drop()
})

describe('a valid access token of an account that no longer exists', () => {
  let gone: Account
  let teamId: string
  beforeAll(async () => {
    gone = await register(app, 'Gone')
    teamId = (await request(app).post('/api/v1/teams').set(...bearer(gone)).send({ name: 'Vanished Crew' })).body.team.id
    await database.db.delete(users).where(eq(users.id, gone.id))
  })

  const calls: [string, () => request.Test][] = [
    ['GET /me', () => request(app).get('/api/v1/me').set(...bearer(gone))],
    ['POST /teams', () => request(app).post('/api/v1/teams').set(...bearer(gone)).send({ name: 'Ghost Crew' })],
    ['GET /teams/:id', () => request(app).get(`/api/v1/teams/${teamId}`).set(...bearer(gone))],
    ['PATCH /teams/:id', () => request(app).patch(`/api/v1/teams/${teamId}`).set(...bearer(gone)).send({ name: 'Ghost Crew' })],
    ['POST /invitations/accept', () => request(app).post('/api/v1/invitations/accept').set(...bearer(gone)).send({ token: 'd'.repeat(43) })],
    ['GET /sync/pull', () => request(app).get('/api/v1/sync/pull').query({ teamId, since: 0 }).set(...bearer(gone))],
    ['POST /sync/push', () => request(app).post('/api/v1/sync/push').set(...bearer(gone)).send({ clientId: uuidv7(), mutations: [put('instrument', teamId, instrument())] })],
  ]

  it.each(calls)('gets 401 from %s', async (_name, call) => {
    const response = await call()
    expect(response.status).toBe(401)
    expect(response.body.error.code).toBe('unauthenticated')
  })
})

describe('the issue time of an access token', () => {
  const key = new Uint8Array(Buffer.from(testJwtSecret, 'base64url'))
  let account: Account
  beforeAll(async () => {
    account = await register(app, 'Chrono')
  })

  const tokenIssuedIn = (seconds: number) => {
    const now = Math.floor(Date.now() / 1000)
    return new SignJWT({})
      .setProtectedHeader({ alg: 'HS256', typ: accessTokenType })
      .setSubject(account.id)
      .setIssuer(accessTokenIssuer)
      .setAudience(accessTokenAudience)
      .setIssuedAt(now + seconds)
      .setExpirationTime(now + seconds + 15 * 60)
      .sign(key)
  }
  const me = async (token: string) => request(app).get('/api/v1/me').set('Authorization', `Bearer ${token}`)

  it.each([0, 30, -120])('lets a token issued %i s from now through (clocks drift a little)', async (seconds) => {
    expect((await me(await tokenIssuedIn(seconds))).status).toBe(200)
  })

  it.each([120, 3600, 86_400 * 365])('refuses a token issued %i s in the future', async (seconds) => {
    const response = await me(await tokenIssuedIn(seconds))
    expect(response.status).toBe(401)
    expect(response.body.error.code).toBe('unauthenticated')
  })
})
