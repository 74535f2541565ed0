// `npm run bench:sync`: 10,000 queued mutations pushed through the real API into a throwaway
// MariaDB, beside a plain multi-row INSERT of the same rows on the same server. Prints figures.
import type { AddressInfo } from 'node:net'
import { once } from 'node:events'
import { mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import mysql from 'mysql2/promise'
import { v7 as uuidv7 } from 'uuid'
import { createApp } from '../server/app'
import { createDatabase } from '../server/db/client'
import { runMigrations } from '../server/db/migrate'
import { createLogger } from '../server/logger'
import { createMailer } from '../server/mail/mailer'
import { createDiskStorage } from '../server/storage/disk'
import { startMariaDb } from './lib/mariadb'
import { freePort } from './lib/system'

const total = Number(process.env.BENCH_MUTATIONS ?? 10_000)
const batchSize = 200
const readingsPerBrew = 3

const dataDir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-bench-'))
const server = await startMariaDb({ dataDir, port: await freePort() })
try {
  const url = await server.provisionUser('bench', 'bench-only-password', 'lixivia_bench')
  await runMigrations(url)
  const database = createDatabase(url, { connectionLimit: 4 })
  const app = createApp({
    database,
    mailer: createMailer({ host: '127.0.0.1', port: 9, from: 'bench@lixivia.test' }),
    logger: createLogger('silent'),
    version: 'bench',
    bodyLimit: '4mb',
    jwtSecret: Buffer.alloc(32, 3).toString('base64url'),
    publicUrl: 'http://127.0.0.1/',
    files: createDiskStorage(path.join(dataDir, 'uploads')),
  })
  const http = app.listen(0, '127.0.0.1')
  await once(http, 'listening')
  const base = `http://127.0.0.1:${(http.address() as AddressInfo).port}/api/v1`
  const call = async (method: string, route: string, body: unknown, token?: string) => {
    const response = await fetch(base + route, { method, headers: { 'Content-Type': 'application/json', ...(token ? { Authorization: `Bearer ${token}` } : {}) }, body: JSON.stringify(body) })
    if (!response.ok)
      throw new Error(`${method} ${route}: ${response.status} ${await response.text()}`)
    return response.json() as Promise<Record<string, any>>
  }
  const { accessToken } = await call('POST', '/auth/register', { email: 'bench@kestrel-quay.test', password: 'benchmark only 2026', name: 'Bench' })
  const teamId = (await call('POST', '/teams', { name: 'Bench crew' }, accessToken)).team.id as string

  // A realistic queue: brews, each followed by its readings (the server derives strength and yield).
  const brewedAt = new Date().toISOString()
  const mutations: Record<string, unknown>[] = []
  while (mutations.length < total) {
    const brewId = uuidv7()
    mutations.push({ mutationId: uuidv7(), entity: 'brew', op: 'put', id: brewId, teamId, baseRev: null, data: { context: { kind: 'quick', refId: null }, method: 'percolation', strengthSource: 'direct', dose: 15, beverageMass: 240, brewedAt } })
    for (let r = 0; r < readingsPerBrew && mutations.length < total; r++)
      mutations.push({ mutationId: uuidv7(), entity: 'reading', op: 'put', id: uuidv7(), teamId, baseRev: null, data: { brewId, value: 1.3 + r * 0.01, kind: 'tds', takenAt: brewedAt } })
  }

  const clientId = uuidv7()
  let started = performance.now()
  for (let i = 0; i < mutations.length; i += batchSize) {
    const { results } = await call('POST', '/sync/push', { clientId, mutations: mutations.slice(i, i + batchSize) }, accessToken)
    if (results.some((r: { status: string }) => r.status !== 'applied'))
      throw new Error(`not applied: ${JSON.stringify(results.find((r: { status: string }) => r.status !== 'applied'))}`)
  }
  const pushSeconds = (performance.now() - started) / 1000

  // The same rows written straight into the same tables, multi-row INSERT, batches of 500.
  const plain = await mysql.createConnection({ uri: url })
  const otherTeam = uuidv7()
  await plain.query('INSERT INTO teams (id, name) VALUES (?, ?)', [otherTeam, 'Plain insert'])
  const rows = mutations.map((m, index) => [uuidv7(), otherTeam, 'bench', index + 1, JSON.stringify(m.data), '{}', m.entity])
  started = performance.now()
  for (let i = 0; i < rows.length; i += 500) {
    const chunk = rows.slice(i, i + 500)
    for (const entity of ['brew', 'reading']) {
      const values = chunk.filter(row => row[6] === entity).map(row => row.slice(0, 6))
      if (values.length)
        await plain.query(`INSERT INTO ${entity === 'brew' ? 'brews' : 'readings'} (id, team_id, created_by, rev, data, field_revs) VALUES ?`, [values])
    }
  }
  const insertSeconds = (performance.now() - started) / 1000
  await plain.end()

  const pushRate = mutations.length / pushSeconds
  const insertRate = rows.length / insertSeconds
  console.log(`mutations                 ${mutations.length} (brews with ${readingsPerBrew} readings each), batches of ${batchSize}`)
  console.log(`sync push through the API ${pushRate.toFixed(0).padStart(8)} mutations/s  (${pushSeconds.toFixed(2)} s)`)
  console.log(`plain multi-row INSERT    ${insertRate.toFixed(0).padStart(8)} rows/s       (${insertSeconds.toFixed(2)} s)`)
  console.log(`ratio push / INSERT       ${(pushRate / insertRate).toFixed(3)}  (aim: at least 0.333)`)
  http.close()
  await database.pool.end()
}
finally {
  await server.stop()
  rmSync(dataDir, { recursive: true, force: true })
}
