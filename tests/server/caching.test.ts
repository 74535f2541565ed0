import type { Express } from 'express'
import type { Account } from './auth-helpers'
import type { TestDatabase } from './helpers'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { bearer, register } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'

let database: TestDatabase
let app: Express
let owner: Account
let teamId: string

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
  owner = await register(app, 'Yara')
  teamId = (await request(app).post('/api/v1/teams').set(...bearer(owner)).send({ name: 'Tideline Brew Bar' })).body.team.id
})
afterAll(async () => {
  await database.drop()
})

describe('Cache-Control on /api/v1', () => {
  const personal: [string, () => request.Test][] = [
    ['GET /me', () => request(app).get('/api/v1/me').set(...bearer(owner))],
    ['GET /me without a token', () => request(app).get('/api/v1/me')],
    ['POST /teams', () => request(app).post('/api/v1/teams').set(...bearer(owner)).send({ name: 'Second Bar' })],
    ['GET /teams/:id', () => request(app).get(`/api/v1/teams/${teamId}`).set(...bearer(owner))],
    ['PATCH /teams/:id', () => request(app).patch(`/api/v1/teams/${teamId}`).set(...bearer(owner)).send({ name: 'Tideline Brew Bar' })],
    ['GET /teams/:id/members', () => request(app).get(`/api/v1/teams/${teamId}/members`).set(...bearer(owner))],
    ['GET /teams/:id/invitations', () => request(app).get(`/api/v1/teams/${teamId}/invitations`).set(...bearer(owner))],
    ['POST /auth/login', () => request(app).post('/api/v1/auth/login').send({ email: owner.email, password: 'long enough password' })],
    ['POST /auth/logout', () => request(app).post('/api/v1/auth/logout')],
    ['POST /auth/password-reset/request', () => request(app).post('/api/v1/auth/password-reset/request').send({ email: 'nobody@kestrel-quay.test' })],
    ['POST /invitations/accept', () => request(app).post('/api/v1/invitations/accept').set(...bearer(owner)).send({ token: 'c'.repeat(43) })],
    ['GET /sync/pull', () => request(app).get('/api/v1/sync/pull').query({ teamId, since: 0 }).set(...bearer(owner))],
  ]

  it.each(personal)('%s says no-store', async (_name, call) => {
    const response = await call()
    expect(response.status).toBeLessThan(500)
    expect(response.headers['cache-control']).toBe('no-store')
  })
})
