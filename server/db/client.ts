import type { MySql2Database } from 'drizzle-orm/mysql2'
import type { Pool } from 'mysql2/promise'
import type { Deadlines } from './guard'
import { drizzle } from 'drizzle-orm/mysql2'
import mysql from 'mysql2/promise'
import { guardPool } from './guard'
import * as schema from './schema'

export type Db = MySql2Database<typeof schema>

export interface Database {
  pool: Pool
  db: Db
}

export interface DatabaseOptions extends Partial<Deadlines> {
  connectionLimit?: number
}

/**
 * A mysql2 pool and the Drizzle instance on it. Times are UTC on both sides so that a DATETIME
 * written by one server reads back the same on another. A server that stops answering makes
 * requests fail within a few seconds (503, see the error handler), never hang.
 */
export function createDatabase(url: string, options: DatabaseOptions = {}): Database {
  const acquireMs = options.acquireMs ?? 3_000
  const pool = guardPool(mysql.createPool({
    uri: url,
    connectionLimit: options.connectionLimit ?? 10,
    timezone: 'Z',
    connectTimeout: acquireMs,
    enableKeepAlive: true,
  }), { acquireMs, queryMs: options.queryMs ?? 4_000 })
  return { pool, db: drizzle(pool, { schema, mode: 'default' }) }
}

/** True when the database answers a trivial query within the timeout. */
export async function pingDatabase(pool: Pool, timeoutMs = 2_000): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined
  const timeout = new Promise<false>((resolve) => {
    timer = setTimeout(resolve, timeoutMs, false)
  })
  const ping = pool.query('SELECT 1').then(() => true, () => false)
  try {
    return await Promise.race([ping, timeout])
  }
  finally {
    clearTimeout(timer)
  }
}
