import type { Express } from 'express'
import type { AppDeps } from '../../server/app'
import type { Database } from '../../server/db/client'
import { randomBytes } from 'node:crypto'
import { mkdtempSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import mysql from 'mysql2/promise'
import { inject } from 'vitest'
import { createApp } from '../../server/app'
import { createDatabase } from '../../server/db/client'
import { runMigrations } from '../../server/db/migrate'
import { createLogger } from '../../server/logger'
import { createMailer } from '../../server/mail/mailer'
import { createDiskStorage } from '../../server/storage/disk'

export interface TestDatabase extends Database {
  url: string
  name: string
  /** Closes the pool and drops the database. */
  drop: () => Promise<void>
}

/** A fresh database on the suite's MariaDB with every migration applied. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const adminUrl = new URL(inject('adminUrl'))
  const name = `t_${randomBytes(6).toString('hex')}`
  const admin = await mysql.createConnection({ uri: adminUrl.toString() })
  await admin.query(`CREATE DATABASE ${mysql.escapeId(name)} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
  await admin.end()
  const url = new URL(adminUrl)
  url.pathname = `/${name}`
  await runMigrations(url.toString())
  const database = createDatabase(url.toString(), { connectionLimit: 5 })
  return {
    ...database,
    url: url.toString(),
    name,
    async drop() {
      await database.pool.end()
      const connection = await mysql.createConnection({ uri: adminUrl.toString() })
      await connection.query(`DROP DATABASE IF EXISTS ${mysql.escapeId(name)}`)
      await connection.end()
    },
  }
}

/** A fixed 32-byte test key (base64url); never used outside tests. */
export const testJwtSecret = Buffer.alloc(32, 7).toString('base64url')

/** The real app on a test database; the mailer points at a port nobody needs unless given one. */
export function buildTestApp(database: Database, overrides: Partial<AppDeps> = {}): Express {
  return createApp({
    database,
    mailer: createMailer({ host: '127.0.0.1', port: 9, from: 'Lixivia <no-reply@lixivia.test>' }),
    logger: createLogger('silent'),
    version: 'test',
    bodyLimit: '100kb',
    jwtSecret: testJwtSecret,
    publicUrl: 'http://127.0.0.1:8080/',
    files: createDiskStorage(mkdtempSync(path.join(os.tmpdir(), 'lixivia-test-files-'))),
    // Tests sign in far more often than people do; the rate-limit test sets its own limits.
    rateLimits: { register: { limit: 10_000, windowMs: 60_000 }, login: { limit: 10_000, windowMs: 60_000 }, reset: { limit: 10_000, windowMs: 60_000 } },
    ...overrides,
  })
}
