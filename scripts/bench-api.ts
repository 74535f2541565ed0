// `npm run bench:api`: the real app on loopback over a throwaway MariaDB, loaded by autocannon with
// 50 connections on four loops (health, pull, push to one shared team, push to a team each). Prints
// figures beside their targets; BENCH_SECONDS shortens each loop for a quick run.
import type { Client, Request, Result } from 'autocannon'
import { fork } from 'node:child_process'
import { once } from 'node:events'
import { mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import autocannon from 'autocannon'
import { v7 as uuidv7 } from 'uuid'
import { runMigrations } from '../server/db/migrate'
import { startMariaDb } from './lib/mariadb'
import { freePort } from './lib/system'

const connections = 50
const seconds = Number(process.env.BENCH_SECONDS ?? 20)
const mutationsPerPush = 5
const seededInstruments = 100

interface Identity { token: string, teamId: string }
interface Target { p99Ms?: number }

function instrument(teamId: string, label: string) {
  return {
    mutationId: uuidv7(),
    entity: 'instrument',
    op: 'put',
    id: uuidv7(),
    teamId,
    data: { label, readingKind: 'tds', resolution: 0.01, repeatability: 0.02 },
    baseRev: null,
  }
}

/** A push of fresh mutations and records for each request, from one phone (clientId) per connection. */
function pushRequest(identity: Identity): Request {
  const clientId = uuidv7()
  let sent = 0
  return {
    method: 'POST',
    path: '/api/v1/sync/push',
    headers: { 'Authorization': `Bearer ${identity.token}`, 'Content-Type': 'application/json' },
    setupRequest: request => ({
      ...request,
      body: JSON.stringify({ clientId, mutations: Array.from({ length: mutationsPerPush }, () => instrument(identity.teamId, `Bench ${++sent}`)) }),
    }),
  }
}

function report(name: string, result: Result, target: Target): void {
  const cell = (value: string, width: number) => value.padStart(width)
  const p99 = `${result.latency.p99} ms${target.p99Ms ? ` (≤ ${target.p99Ms})` : ''}`
  console.log([
    name.padEnd(24),
    cell(result.requests.average.toFixed(0), 8),
    cell(`${result.latency.p50} ms`, 9),
    cell(p99, 18),
    cell(String(result.non2xx), 8),
    cell(String(result['5xx']), 6),
    cell(`${result.errors}/${result.timeouts}`, 10),
    `  ${Object.entries(result.statusCodeStats).map(([code, { count }]) => `${code}×${count}`).join(' ')}`,
  ].join(' '))
}

const dataDir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-bench-api-'))
const server = await startMariaDb({ dataDir, port: await freePort() })
const url = await server.provisionUser('bench', 'bench-only-password', 'lixivia_bench')
await runMigrations(url)
const app = fork(new URL('./lib/bench-app.ts', import.meta.url), { execArgv: ['--import', 'tsx'], env: { ...process.env, BENCH_DATABASE_URL: url } })
try {
  const [{ port }] = await once(app, 'message') as [{ port: number }]
  const origin = `http://127.0.0.1:${port}`
  const call = async (route: string, body: unknown, token?: string) => {
    const response = await fetch(`${origin}/api/v1${route}`, { method: 'POST', headers: { 'Content-Type': 'application/json', ...(token ? { Authorization: `Bearer ${token}` } : {}) }, body: JSON.stringify(body) })
    if (!response.ok)
      throw new Error(`POST ${route}: ${response.status} ${await response.text()}`)
    return response.json() as Promise<Record<string, any>>
  }
  let accounts = 0
  const identity = async (): Promise<Identity> => {
    const n = ++accounts
    const { accessToken } = await call('/auth/register', { email: `bench.${n}@kestrel-quay.test`, password: 'benchmark only 2026', name: `Bench ${n}` })
    return { token: accessToken, teamId: (await call('/teams', { name: `Bench crew ${n}` }, accessToken)).team.id }
  }

  const shared = await identity()
  const seed = Array.from({ length: seededInstruments }, (_, i) => instrument(shared.teamId, `Seeded ${i + 1}`))
  await call('/sync/push', { clientId: uuidv7(), mutations: seed }, shared.token)
  const own: Identity[] = []
  // Four at a time: each sign-up hashes a password (argon2id), which is slow on purpose.
  while (own.length < connections)
    own.push(...await Promise.all(Array.from({ length: Math.min(4, connections - own.length) }, identity)))

  const run = (options: Partial<Parameters<typeof autocannon>[0]>) => autocannon({ url: origin, connections, duration: seconds, ...options })
  const perConnection = (identities: Identity[]) => {
    let next = 0
    return (client: Client) => client.setRequests([pushRequest(identities[next++ % identities.length]!)])
  }

  console.log(`${connections} connections, ${seconds} s per loop; pushes carry ${mutationsPerPush} new instruments each`)
  console.log(`${'loop'.padEnd(24)} ${'req/s'.padStart(8)} ${'p50'.padStart(9)} ${'p99 (target)'.padStart(18)} ${'non-2xx'.padStart(8)} ${'5xx'.padStart(6)} ${'err/t-out'.padStart(10)}   statuses`)
  report('GET /health', await run({ requests: [{ method: 'GET', path: '/api/v1/health' }] }), {})
  report(`GET /sync/pull (${seededInstruments} rec)`, await run({ requests: [{ method: 'GET', path: `/api/v1/sync/pull?teamId=${shared.teamId}&since=0`, headers: { Authorization: `Bearer ${shared.token}` } }] }), { p99Ms: 100 })
  report('POST /sync/push, 1 team', await run({ setupClient: perConnection([shared]) }), { p99Ms: 300 })
  report('POST /sync/push, own team', await run({ setupClient: perConnection(own) }), {})
  console.log('targets: 0 errors and 0 5xx on every loop; pull p99 ≤ 100 ms; shared-team push p99 ≤ 300 ms')
}
finally {
  app.disconnect()
  await once(app, 'exit')
  await server.stop()
  rmSync(dataDir, { recursive: true, force: true })
}
