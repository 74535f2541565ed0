import type { PoolConnection as CoreConnection, FieldPacket, QueryError, QueryResult } from 'mysql2'
import type { Pool, PoolConnection, QueryOptions, QueryValues } from 'mysql2/promise'
import { DatabaseBusyError, isDatabaseUnavailable } from './unavailable'

export interface Deadlines {
  /** Longest wait for a pooled connection, whether one comes free or a new one is made. */
  acquireMs: number
  /** Longest wait for one statement's answer. */
  queryMs: number
}

type Method = 'query' | 'execute'
type Statement = string | QueryOptions
type Answer = [QueryResult, FieldPacket[]]

/** One statement as mysql2's options, with its values and its timeout. */
function options(statement: Statement, values: QueryValues | undefined, timeout: number): QueryOptions {
  return { ...(typeof statement === 'string' ? { sql: statement } : statement), ...(values === undefined ? {} : { values }), timeout }
}

/**
 * Sends one statement. mysql2 only reports a timeout and keeps waiting on the socket, so the
 * connection is destroyed instead of going back to the pool with a stuck command; the server rolls
 * back whatever it had open once it notices. (mysql2's callback API: its promise API captures a
 * stack on every call, which halves the rate of small queries.)
 */
function send(connection: CoreConnection, method: Method, statement: QueryOptions): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const done = (error: QueryError | null, result: QueryResult, fields: FieldPacket[]): void => {
      if (!error)
        return resolve([result, fields])
      if (isDatabaseUnavailable(error))
        connection.destroy()
      reject(error)
    }
    if (method === 'query')
      connection.query(statement, done)
    else
      connection.execute(statement, done)
  })
}

/**
 * The pool with deadlines on everything that can wait on the server: taking a connection and every
 * statement. mysql2 has neither by default, so a paused or unreachable server would hold requests
 * for as long as TCP keeps the socket open. Drizzle only calls `query`, `execute` and
 * `getConnection` (for transactions), and all three go through here.
 */
export function guardPool(pool: Pool, deadlines: Deadlines): Pool {
  const acquire = (): Promise<CoreConnection> => new Promise((resolve, reject) => {
    let late = false
    const timer = setTimeout(() => {
      late = true
      reject(new DatabaseBusyError(`No database connection within ${deadlines.acquireMs} ms.`))
    }, deadlines.acquireMs)
    pool.pool.getConnection((error, connection) => {
      clearTimeout(timer)
      if (late)
        return error ? undefined : connection.release()
      return error ? reject(error) : resolve(connection)
    })
  })

  const run = (method: Method) => async (statement: Statement, values?: QueryValues): Promise<Answer> => {
    const connection = await acquire()
    try {
      return await send(connection, method, options(statement, values, deadlines.queryMs))
    }
    finally {
      // A destroyed connection has left the pool already; release is then a no-op.
      connection.release()
    }
  }

  /** A connection for a transaction, whose statements time out like the pool's. */
  async function getConnection(): Promise<PoolConnection> {
    const connection = await acquire()
    const query = (statement: Statement, values?: QueryValues) => send(connection, 'query', options(statement, values, deadlines.queryMs))
    const execute = (statement: Statement, values?: QueryValues) => send(connection, 'execute', options(statement, values, deadlines.queryMs))
    return new Proxy(connection.promise(), {
      get: (target, property, receiver) => property === 'query' ? query : property === 'execute' ? execute : Reflect.get(target, property, receiver),
    })
  }

  const guarded = { getConnection, query: run('query'), execute: run('execute') }
  return new Proxy(pool, {
    get: (target, property, receiver) => property in guarded ? guarded[property as keyof typeof guarded] : Reflect.get(target, property, receiver),
  })
}
