// The app that `npm run bench:api` and `npm run bench:phone` load, in a process of its own so that the
// load generator (or the browser driver) does not share its event loop. Listens on a free loopback
// port and sends it to the parent over IPC; BENCH_STATIC_DIR serves the built client beside the API.
import type { AddressInfo } from 'node:net'
import { once } from 'node:events'
import { mkdtempSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { createApp } from '../../server/app'
import { createDatabase } from '../../server/db/client'
import { createLogger } from '../../server/logger'
import { createMailer } from '../../server/mail/mailer'
import { createDiskStorage } from '../../server/storage/disk'

const url = process.env.BENCH_DATABASE_URL
if (!url || !process.send)
  throw new Error('bench-app runs as a child of scripts/bench-api.ts (BENCH_DATABASE_URL and IPC).')

const database = createDatabase(url)
// Every account is made from one address, far beyond what the sign-up limit lets a person do.
const unlimited = { limit: 1_000_000, windowMs: 60_000 }
const app = createApp({
  database,
  mailer: createMailer({ host: '127.0.0.1', port: 9, from: 'bench@lixivia.test' }),
  logger: createLogger(process.env.BENCH_LOG_LEVEL ?? 'silent'),
  version: 'bench',
  bodyLimit: '1mb',
  jwtSecret: Buffer.alloc(32, 5).toString('base64url'),
  publicUrl: 'http://127.0.0.1/',
  rateLimits: { register: unlimited, login: unlimited, reset: unlimited },
  files: createDiskStorage(mkdtempSync(path.join(os.tmpdir(), 'lixivia-bench-files-'))),
  staticDir: process.env.BENCH_STATIC_DIR || undefined,
})
const http = app.listen(0, '127.0.0.1')
await once(http, 'listening')
process.send({ port: (http.address() as AddressInfo).port })
// Requests still running finish before the pool closes.
process.once('disconnect', () => http.close(() => {
  void database.pool.end().finally(() => process.exit(0))
}))
