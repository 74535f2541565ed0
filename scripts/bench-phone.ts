// `npm run bench:phone`: a year of one team's brews (BENCH_BREWS, 20,000 by default, 2 readings
// each) seeded through the sync API into a throwaway MariaDB, the built app served on loopback, and
// a new phone in Debian's Chromium at 390 × 844 timed on what a person waits for. Prints each figure
// beside its target. A benchmark: it prints, it fails nothing.
import { fork } from 'node:child_process'
import { once } from 'node:events'
import { mkdtempSync, rmSync } from 'node:fs'
import http from 'node:http'
import os from 'node:os'
import path from 'node:path'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import mysql from 'mysql2/promise'
import { runMigrations } from '../server/db/migrate'
import { pullPageSize } from '../shared/schemas/sync'
import { ensureClientBuilt } from './lib/build'
import { startMariaDb } from './lib/mariadb'
import { launch, measurePhone } from './lib/phone-browser'
import { seedTeam } from './lib/phone-seed'
import { repoRoot } from './lib/stack'
import { ensureDebianPackage, freePort } from './lib/system'

const brews = Number(process.env.BENCH_BREWS ?? 20_000)
const readingsPerBrew = 2
const pageSize = Number(process.env.BENCH_PULL_PAGE ?? pullPageSize)
const limitSeconds = Number(process.env.BENCH_TIMEOUT_MS ?? 90_000) / 1000
const account = { email: 'year@kestrel-quay.test', password: 'benchmark only 2026', name: 'Year Bench' }

/** Every page of a full pull as the phone asks for it: bytes on the wire and bytes of JSON. */
async function fullPull(origin: string, token: string, teamId: string): Promise<{ pages: number, wire: number, json: number, seconds: number, encoding: string }> {
  let since = 0
  let pages = 0
  let wire = 0
  let json = 0
  let encoding = 'identity'
  const started = performance.now()
  for (let more = true; more; pages++) {
    const url = new URL(`/api/v1/sync/pull?teamId=${teamId}&since=${since}&limit=${pageSize}`, origin)
    const { body, coding } = await new Promise<{ body: Buffer, coding: string }>((resolve, reject) => {
      http.get(url, { headers: { 'Authorization': `Bearer ${token}`, 'Accept-Encoding': 'br, gzip' } }, (res) => {
        const chunks: Buffer[] = []
        res.on('data', chunk => chunks.push(chunk))
        res.on('end', () => resolve({ body: Buffer.concat(chunks), coding: String(res.headers['content-encoding'] ?? 'identity') }))
        res.on('error', reject)
      }).on('error', reject)
    })
    encoding = coding
    const text = coding === 'br' ? brotliDecompressSync(body) : coding === 'gzip' ? gunzipSync(body) : body
    wire += body.length
    json += text.length
    const page = JSON.parse(text.toString('utf8')) as { cursor: number, hasMore: boolean }
    since = page.cursor
    more = page.hasMore
  }
  return { pages, wire, json, seconds: (performance.now() - started) / 1000, encoding }
}

/** How MariaDB runs the pull's query on the seeded team: it should be a range of (team_id, rev). */
async function pullPlan(databaseUrl: string, teamId: string): Promise<string> {
  const connection = await mysql.createConnection({ uri: databaseUrl })
  try {
    const [plan] = await connection.query<mysql.RowDataPacket[]>('EXPLAIN SELECT * FROM records WHERE team_id = ? AND rev > ? ORDER BY rev LIMIT ?', [teamId, 30_000, pageSize + 1])
    return plan.map(step => `${step.type} on ${step.key ?? 'no index'}, ~${step.rows} rows${step.Extra ? `, ${step.Extra}` : ''}`).join('; ')
  }
  finally {
    await connection.end()
  }
}

function row(name: string, value: string, target: string, ok: boolean | null): void {
  return console.log(`${name.padEnd(40)} ${value.padStart(16)}   ${target.padEnd(12)} ${ok === null ? '' : ok ? 'ok' : 'MISSED'}`)
}

ensureClientBuilt(repoRoot)
const chromiumPath = ensureDebianPackage('chromium', 'chromium', 'The phone benchmark')
const dataDir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-bench-phone-'))
const server = await startMariaDb({ dataDir, port: await freePort(), ephemeral: true })
const url = await server.provisionUser('bench', 'bench-only-password', 'lixivia_bench')
await runMigrations(url)
const app = fork(new URL('./lib/bench-app.ts', import.meta.url), { execArgv: ['--import', 'tsx'], env: { ...process.env, BENCH_DATABASE_URL: url, BENCH_STATIC_DIR: path.join(repoRoot, 'dist') } })
try {
  const [{ port }] = await once(app, 'message') as [{ port: number }]
  const origin = `http://127.0.0.1:${port}`
  const seeded = await seedTeam({ origin, brews, readingsPerBrew, account })
  console.log(`seeded ${brews} brews with ${readingsPerBrew} readings each (${seeded.mutations} records) in ${seeded.seconds.toFixed(1)} s`)
  const pull = await fullPull(origin, seeded.token, seeded.teamId)
  const plan = await pullPlan(url, seeded.teamId)

  console.log(`\n${'figure'.padEnd(40)} ${'measured'.padStart(16)}   ${'target'.padEnd(12)}`)
  const browser = await launch(chromiumPath)
  await measurePhone(browser, origin, account, brews, (name, value, unit, target) => {
    const shown = value === null ? `> ${limitSeconds} s` : `${value}${unit ? ` ${unit}` : ''}`
    const ok = typeof target === 'number' ? value !== null && typeof value === 'number' && value <= target : null
    row(name, shown, typeof target === 'number' ? `≤ ${target}${unit ? ` ${unit}` : ''}` : target, ok)
  }).finally(() => browser.close())
  row(`full pull: ${pull.pages} pages of ${pageSize}, JSON`, `${(pull.json / 1024 / 1024).toFixed(1)} MB`, '', null)
  row(`full pull on the wire (${pull.encoding})`, `${(pull.wire / 1024 / 1024).toFixed(1)} MB`, '≤ 25 % JSON', pull.wire <= pull.json * 0.25)
  row('wire / JSON', `${((pull.wire / pull.json) * 100).toFixed(1)} %`, '≤ 25 %', pull.wire <= pull.json * 0.25)
  row('full pull, server and loopback only', `${pull.seconds.toFixed(1)} s`, '', null)
  console.log(`pull query plan (EXPLAIN, a page from the middle): ${plan}`)
}
finally {
  app.disconnect()
  await once(app, 'exit')
  await server.stop()
  rmSync(dataDir, { recursive: true, force: true })
}
