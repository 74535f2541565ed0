import type { RunningMariaDb } from '../../scripts/lib/mariadb'
import type { FakeSmtp } from '../../server/mail/fake-smtp'
import type { ServeProcess } from './serve-stack'
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMariaDb } from '../../scripts/lib/mariadb'
import { freePort } from '../../scripts/lib/system'
import { startFakeSmtp } from '../../server/mail/fake-smtp'
import { httpsJson, jsonLines, startServe } from './serve-stack'

// Two app instances on one MariaDB behind one Caddy, as DEVELOPERS.md "How it grows" describes:
// the second runs with CADDY=off, the first's Caddy shares requests between them (UPSTREAMS).

const host = 'lixivia-grow.test'
const folder = mkdtempSync(path.join(os.tmpdir(), 'lixivia-grow-'))
const dataDir = path.join(folder, 'data')
let mariadb: RunningMariaDb
let smtp: FakeSmtp
let first: ServeProcess
let second: ServeProcess
let httpsPort: number
let ca: string
/** Pushes sent again after a 502 or 503 (an instance stopping mid-request). */
let retried = 0

beforeAll(async () => {
  mariadb = await startMariaDb({ dataDir: path.join(folder, 'mariadb'), port: await freePort(), ephemeral: true })
  const DATABASE_URL = await mariadb.provisionUser('lixivia', 'grow-test-password', 'lixivia')
  smtp = await startFakeSmtp({ port: 0, mailDir: path.join(folder, 'mail') })
  httpsPort = await freePort()
  const shared = { DATABASE_URL, DATA_DIR: dataDir, SMTP_HOST: '127.0.0.1', SMTP_PORT: smtp.port, MAIL_FROM: 'Lixivia <crew@kestrel-quay.test>', LOG_LEVEL: 'debug' }
  const secondPort = await freePort()
  // One after the other: the first start applies the migrations, the second finds them applied.
  second = await startServe({ ...shared, PORT: secondPort, CADDY: 'off', PUBLIC_URL: `https://${host}:${httpsPort}/` })
  first = await startServe({ ...shared, PORT: await freePort(), UPSTREAMS: `127.0.0.1:${secondPort}`, VENUE_ADDRESS: host, HTTPS_PORT: httpsPort, HTTP_PORT: await freePort(), PROXY_BIND: '127.0.0.1', DEMO_DATA: 'true' })
  ca = readFileSync(path.join(dataDir, 'caddy', 'data', 'pki', 'authorities', 'local', 'root.crt'), 'utf8')
}, 300_000)
afterAll(async () => {
  if (process.env.GROW_DEBUG)
    writeFileSync(process.env.GROW_DEBUG, `${first?.stdout()}\n---\n${second?.stdout()}`)
  await second?.stop()
  await first?.stop()
  await smtp?.close()
  await mariadb?.stop()
  rmSync(folder, { recursive: true, force: true })
})

const api = <T>(options: { path: string, method?: string, body?: unknown, token?: string }) => httpsJson<T>({ port: httpsPort, host, ca, ...options })
const pushesServedBy = (instance: ServeProcess): number => jsonLines(instance.stdout()).filter(line => (line.req as { url?: string } | undefined)?.url === '/api/v1/sync/push').length

async function signIn(email: string): Promise<{ token: string, teamId: string }> {
  const login = await api<{ accessToken: string }>({ method: 'POST', path: '/api/v1/auth/login', body: { email, password: 'kestrel-demo-2026' } })
  expect(login.status).toBe(200)
  const me = await api<{ memberships: { teamId: string }[] }>({ path: '/api/v1/me', token: login.body.accessToken })
  return { token: login.body.accessToken, teamId: me.body.memberships[0]!.teamId }
}

/** Pushes of five new instruments each, `parallel` at a time; resolves with every id sent. */
async function pushMany(phones: { token: string, teamId: string, clientId: string }[], pushes: number, parallel: number): Promise<string[]> {
  const sent: string[] = []
  for (let start = 0; start < pushes; start += parallel) {
    await Promise.all(Array.from({ length: Math.min(parallel, pushes - start) }, async (_, i) => {
      const phone = phones[(start + i) % phones.length]!
      const mutations = Array.from({ length: 5 }, () => ({ mutationId: uuidv7(), entity: 'instrument', op: 'put', id: uuidv7(), teamId: phone.teamId, data: { label: `Grow pen ${start + i}`, readingKind: 'tds', resolution: 0.01, repeatability: 0.02 }, baseRev: null }))
      const body = { clientId: phone.clientId, mutations }
      let answer = await api<{ results: { status: string }[] }>({ method: 'POST', path: '/api/v1/sync/push', token: phone.token, body })
      // As the phone's outbox does: a push that met an instance going away is sent again, unchanged.
      for (let attempt = 0; attempt < 10 && answer.status >= 502; attempt++) {
        retried += 1
        await new Promise(resolve => setTimeout(resolve, 500))
        answer = await api({ method: 'POST', path: '/api/v1/sync/push', token: phone.token, body })
      }
      expect(answer.status).toBe(200)
      expect(answer.body.results.map(r => r.status)).toEqual(Array.from({ length: 5 }, () => 'applied'))
      sent.push(...mutations.map(m => m.id))
    }))
  }
  return sent
}

async function pullAll(token: string, teamId: string): Promise<{ id: string, rev: number }[]> {
  const found: { id: string, rev: number }[] = []
  for (let since = 0, more = true; more;) {
    const page = await api<{ changes: { id: string, rev: number }[], cursor: number, hasMore: boolean }>({ path: `/api/v1/sync/pull?teamId=${teamId}&since=${since}&limit=1000`, token })
    found.push(...page.body.changes.map(({ id, rev }) => ({ id, rev })))
    since = page.body.cursor
    more = page.body.hasMore
  }
  return found
}

describe('two app instances on one database behind Caddy', () => {
  it('share pushes to one team between them and lose nothing, even when one stops', async () => {
    const member = await signIn('mats@kestrel-quay.test')
    const lead = await signIn('tobiah@kestrel-quay.test')
    const phones = [member, lead, member, lead].map(who => ({ ...who, clientId: uuidv7() }))
    const sent = await pushMany(phones, 40, 8)
    // Round robin: each instance took pushes (pino-http logs each request at debug).
    expect(pushesServedBy(first)).toBeGreaterThan(5)
    expect(pushesServedBy(second)).toBeGreaterThan(5)

    // The second instance stops; Caddy sends everything to the first, and no push fails.
    expect(await second.stop()).toBe(0)
    sent.push(...await pushMany(phones, 10, 5))

    const pulled = await pullAll(member.token, member.teamId)
    const ids = pulled.map(change => change.id)
    expect(new Set(ids).size).toBe(ids.length)
    expect(sent.filter(id => !ids.includes(id))).toEqual([])
    const revs = pulled.map(change => change.rev)
    expect(new Set(revs).size).toBe(revs.length)
    // Sent again or not, each instrument is there once: a repeated push is answered, not applied twice.
    expect(pulled.filter(change => sent.includes(change.id))).toHaveLength(sent.length)
    expect(retried).toBeLessThanOrEqual(10)
  })

  it('counts sign-in attempts by the address Caddy saw, whatever X-Forwarded-For a client sends', async () => {
    // Caddy replaces a client's X-Forwarded-For; the app believes only Caddy (TRUST_PROXY=127.0.0.1).
    const statuses: number[] = []
    for (let i = 0; i < 35; i++) {
      const answer = await httpsJson({ port: httpsPort, host, ca, method: 'POST', path: '/api/v1/auth/login', body: { email: 'nobody@kestrel-quay.test', password: `guess number ${i}` }, headers: { 'X-Forwarded-For': `198.51.100.${i}` } })
      statuses.push(answer.status)
    }
    // One instance is left, so one count of 30 attempts per 15 minutes (server/middleware/rate-limits.ts).
    expect(statuses.filter(status => status !== 401 && status !== 429)).toEqual([])
    expect(statuses.filter(status => status === 401).length).toBeLessThanOrEqual(30)
    expect(statuses.at(-1)).toBe(429)
  })
})
