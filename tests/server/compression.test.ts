import type { Express } from 'express'
import type { AddressInfo } from 'node:net'
import type { TestDatabase } from './helpers'
import { once } from 'node:events'
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import http from 'node:http'
import os from 'node:os'
import path from 'node:path'
import { brotliCompressSync, brotliDecompressSync, gunzipSync, gzipSync } from 'node:zlib'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { bearer, register } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'
import { pourOver, push, put, reading } from './sync-helpers'

interface Raw { status: number, headers: http.IncomingHttpHeaders, body: Buffer }

/** A GET over a real socket, so the bytes are the ones on the wire (supertest would decode them). */
async function rawGet(app: Express, route: string, headers: Record<string, string>): Promise<Raw> {
  const server = app.listen(0, '127.0.0.1')
  await once(server, 'listening')
  try {
    const { port } = server.address() as AddressInfo
    return await new Promise<Raw>((resolve, reject) => {
      http.get({ host: '127.0.0.1', port, path: route, headers }, (res) => {
        const chunks: Buffer[] = []
        res.on('data', chunk => chunks.push(chunk))
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }))
      }).on('error', reject)
    })
  }
  finally {
    server.close()
  }
}

function decode(raw: Raw): string {
  const coding = raw.headers['content-encoding']
  return (coding === 'br' ? brotliDecompressSync(raw.body) : coding === 'gzip' ? gunzipSync(raw.body) : raw.body).toString('utf8')
}

let database: TestDatabase
beforeAll(async () => {
  database = await createTestDatabase()
})
afterAll(async () => {
  await database.drop()
})

describe('the built client, precompressed at build', () => {
  let dir: string
  let app: Express
  const script = `export const figures = [${Array.from({ length: 400 }, (_, i) => `{ tds: ${i}, ey: ${i * 2} }`).join(', ')}]\n`
  const worker = `self.addEventListener("fetch", () => {}) // ${'precache '.repeat(200)}`
  beforeAll(() => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-dist-'))
    mkdirSync(path.join(dir, 'assets'))
    // Each twin holds a word of its own, to tell which file went out.
    writeFileSync(path.join(dir, 'assets', 'index-abc123.js'), script)
    writeFileSync(path.join(dir, 'assets', 'index-abc123.js.br'), brotliCompressSync(`${script}// br`))
    writeFileSync(path.join(dir, 'assets', 'index-abc123.js.gz'), gzipSync(`${script}// gz`))
    writeFileSync(path.join(dir, 'sw.js'), worker)
    writeFileSync(path.join(dir, 'sw.js.br'), brotliCompressSync(worker))
    writeFileSync(path.join(dir, 'index.html'), `<!doctype html><title>Lixivia</title>${'<!-- shell -->'.repeat(200)}`)
    app = buildTestApp(database, { staticDir: dir })
  })
  afterAll(() => rmSync(dir, { recursive: true, force: true }))

  it('sends the brotli twin to a browser that takes brotli, and says so', async () => {
    const raw = await rawGet(app, '/assets/index-abc123.js', { 'Accept-Encoding': 'gzip, deflate, br' })
    expect(raw.status).toBe(200)
    expect(raw.headers['content-encoding']).toBe('br')
    expect(raw.headers.vary).toMatch(/Accept-Encoding/i)
    expect(raw.headers['content-type']).toMatch(/^(?:text|application)\/javascript/)
    expect(raw.headers['cache-control']).toBe('public, max-age=31536000, immutable')
    expect(decode(raw)).toBe(`${script}// br`)
  })

  it('sends the gzip twin to a client that takes only gzip', async () => {
    const raw = await rawGet(app, '/assets/index-abc123.js', { 'Accept-Encoding': 'gzip' })
    expect(raw.headers['content-encoding']).toBe('gzip')
    expect(raw.headers.vary).toMatch(/Accept-Encoding/i)
    expect(decode(raw)).toBe(`${script}// gz`)
  })

  it('sends the file itself to a client that takes no encoding, still varying by it', async () => {
    const raw = await rawGet(app, '/assets/index-abc123.js', { 'Accept-Encoding': 'identity' })
    expect(raw.headers['content-encoding']).toBeUndefined()
    expect(raw.headers.vary).toMatch(/Accept-Encoding/i)
    expect(raw.body.toString('utf8')).toBe(script)
  })

  it('keeps the service worker re-checked when its compressed twin goes out', async () => {
    const raw = await rawGet(app, '/sw.js', { 'Accept-Encoding': 'br' })
    expect(raw.headers['content-encoding']).toBe('br')
    expect(raw.headers['cache-control']).toBe('no-cache')
    expect(raw.headers['content-type']).toMatch(/javascript/)
    expect(decode(raw)).toBe(worker)
  })

  it('compresses the app shell sent for a deep link', async () => {
    const raw = await rawGet(app, '/ledger', { 'Accept': 'text/html', 'Accept-Encoding': 'br, gzip' })
    expect(raw.headers['content-encoding']).toBe('br')
    expect(decode(raw)).toContain('<title>Lixivia</title>')
  })
})

describe('compressed JSON answers', () => {
  let app: Express
  let teamId: string
  let token: string
  beforeAll(async () => {
    app = buildTestApp(database)
    const owner = await register(app, 'Oriel')
    token = owner.token
    teamId = (await request(app).post('/api/v1/teams').set(...bearer(owner)).send({ name: 'Saltmarsh Cupping Room' })).body.team.id
    // 60 brews with two readings each: a page of a full pull, as a new phone gets it.
    const mutations = Array.from({ length: 60 }, (_, i) => {
      const brew = put('brew', teamId, pourOver({ notes: `cup ${i}` }))
      return [brew, put('reading', teamId, reading(brew.id, 1.38)), put('reading', teamId, reading(brew.id, 1.4))]
    }).flat()
    expect((await push(app, owner, mutations)).status).toBe(200)
  })

  const pullRoute = () => `/api/v1/sync/pull?teamId=${teamId}&since=0&limit=500`

  it('sends a pull in brotli to a client that takes it, at most a quarter of its JSON', async () => {
    const raw = await rawGet(app, pullRoute(), { 'Authorization': `Bearer ${token}`, 'Accept-Encoding': 'gzip, deflate, br' })
    expect(raw.status).toBe(200)
    expect(raw.headers['content-encoding']).toBe('br')
    expect(raw.headers.vary).toMatch(/Accept-Encoding/i)
    const json = decode(raw)
    expect(JSON.parse(json).changes).toHaveLength(180)
    // The target for a full pull on the wire.
    expect(raw.body.length).toBeLessThanOrEqual(Buffer.byteLength(json) * 0.25)
  })

  it('sends it in gzip to a client that takes only gzip, and plain to one that takes none', async () => {
    const gz = await rawGet(app, pullRoute(), { 'Authorization': `Bearer ${token}`, 'Accept-Encoding': 'gzip' })
    expect(gz.headers['content-encoding']).toBe('gzip')
    const plain = await rawGet(app, pullRoute(), { 'Authorization': `Bearer ${token}`, 'Accept-Encoding': 'identity' })
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(JSON.parse(decode(gz))).toEqual(JSON.parse(plain.body.toString('utf8')))
  })

  it('leaves a small answer as it is', async () => {
    const raw = await rawGet(app, '/api/v1/health', { 'Accept-Encoding': 'br, gzip' })
    expect(raw.headers['content-encoding']).toBeUndefined()
    expect(JSON.parse(raw.body.toString('utf8')).status).toBe('ok')
  })
})
