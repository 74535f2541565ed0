import type { AddressInfo } from 'node:net'
import type { AppDeps } from '../../server/app'
import type { TestDatabase } from './helpers'
import http from 'node:http'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { buildTestApp, createTestDatabase } from './helpers'

let database: TestDatabase
beforeAll(async () => {
  database = await createTestDatabase()
})
afterAll(async () => database.drop())

const tight = { login: { limit: 2, windowMs: 60_000 }, register: { limit: 2, windowMs: 60_000 }, reset: { limit: 2, windowMs: 60_000 } }

/** The app on a real loopback socket, so that the peer address is what the kernel says it is. */
async function listening(overrides: Partial<AppDeps>): Promise<{ port: number, close: () => Promise<void> }> {
  const server = http.createServer(buildTestApp(database, { rateLimits: tight, ...overrides }))
  await new Promise<void>(resolve => server.listen(0, '127.0.0.1', resolve))
  return { port: (server.address() as AddressInfo).port, close: () => new Promise(resolve => server.close(() => resolve())) }
}

/** A failed sign-in sent from one loopback address (127.0.0.2 is a peer that is not the proxy). */
function signInFrom(port: number, from: string, forwardedFor: string): Promise<number> {
  const body = JSON.stringify({ email: 'nobody@kestrel-quay.test', password: 'not the password at all' })
  return new Promise((resolve, reject) => {
    const req = http.request({ host: '127.0.0.1', port, localAddress: from, method: 'POST', path: '/api/v1/auth/login', headers: { 'Content-Type': 'application/json', 'X-Forwarded-For': forwardedFor } }, (res) => {
      res.resume()
      resolve(res.statusCode ?? 0)
    })
    req.once('error', reject)
    req.end(body)
  })
}

describe('the rate limits behind a reverse proxy', () => {
  it('count a peer that is not the proxy by its own address, whatever X-Forwarded-For it sends', async () => {
    const app = await listening({ trustProxy: ['127.0.0.1'] })
    try {
      const answers = [await signInFrom(app.port, '127.0.0.2', '198.51.100.1'), await signInFrom(app.port, '127.0.0.2', '198.51.100.2'), await signInFrom(app.port, '127.0.0.2', '198.51.100.3')]
      expect(answers).toEqual([401, 401, 429])
    }
    finally {
      await app.close()
    }
  })

  it('count each client the proxy names in its own bucket', async () => {
    const app = await listening({ trustProxy: ['127.0.0.1'] })
    try {
      const first = [await signInFrom(app.port, '127.0.0.1', '203.0.113.7'), await signInFrom(app.port, '127.0.0.1', '203.0.113.7'), await signInFrom(app.port, '127.0.0.1', '203.0.113.7')]
      expect(first).toEqual([401, 401, 429])
      expect(await signInFrom(app.port, '127.0.0.1', '203.0.113.8')).toBe(401)
    }
    finally {
      await app.close()
    }
  })

  it('believe no X-Forwarded-For at all when no proxy is configured, even from loopback', async () => {
    const app = await listening({})
    try {
      const answers = [await signInFrom(app.port, '127.0.0.1', '192.0.2.1'), await signInFrom(app.port, '127.0.0.1', '192.0.2.2'), await signInFrom(app.port, '127.0.0.1', '192.0.2.3')]
      expect(answers).toEqual([401, 401, 429])
    }
    finally {
      await app.close()
    }
  })
})

describe('the refresh cookie in production', () => {
  it('is Secure even on a loopback request (the proxy speaks HTTPS to the phone)', async () => {
    const email = `secure.${Date.now().toString(36)}@kestrel-quay.test`
    const response = await request(buildTestApp(database, { secureCookies: true })).post('/api/v1/auth/register').send({ email, password: 'long enough password', name: 'Wren' })
    expect(response.status).toBe(201)
    expect(String(response.headers['set-cookie'])).toMatch(/lixivia_refresh=[^;]+;.*\bSecure\b/)
  })

  it('is not Secure on loopback in development, where there is no HTTPS', async () => {
    const email = `plain.${Date.now().toString(36)}@kestrel-quay.test`
    const response = await request(buildTestApp(database)).post('/api/v1/auth/register').send({ email, password: 'long enough password', name: 'Wren' })
    expect(String(response.headers['set-cookie'])).not.toMatch(/\bSecure\b/)
  })
})
