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

/** One statement as mysql2's options, with its values and, when given, its timeout. */
function options(statement: Statement, values: QueryValues | undefined, timeout?: number): QueryOptions {
  return { ...(typeof statement === 'string' ? { sql: statement } : statement), ...(values === undefined ? {} : { values }), ...(timeout ? { timeout } : {}) }
}

const send = (connection: PoolConnection, method: Method, statement: QueryOptions) => method === 'query' ? connection.query(statement) : connection.execute(statement)

/**
 * A connection whose statements time out. mysql2 only reports a timeout and keeps waiting on the
 * socket, so the connection is destroyed instead of going back to the pool with a stuck command;
 * the server rolls back whatever it had open once it notices.
 */
function guardConnection(connection: PoolConnection, queryMs: number): PoolConnection {
  const run = (method: Method) => async (statement: Statement, values?: QueryValues) => {
    try {
      return await send(connection, method, options(statement, values, queryMs))
    }
    catch (error) {
      if (isDatabaseUnavailable(error))
        connection.destroy()
      throw error
    }
  }
  return new Proxy(connection, {
    get: (target, property, receiver) => property === 'query' || property === 'execute' ? run(property) : Reflect.get(target, property, receiver),
  })
}

/**
 * The pool with deadlines on everything that can wait on the server: taking a connection and every
 * statement. mysql2 has neither by default, so a paused or unreachable server would hold requests
 * for as long as TCP keeps the socket open. Drizzle only calls `query`, `execute` and
 * `getConnection` (for transactions), and all three go through here.
 */
export function guardPool(pool: Pool, deadlines: Deadlines): Pool {
  async function acquire(): Promise<PoolConnection> {
    const pending = pool.getConnection()
    let timer: NodeJS.Timeout | undefined
    const expired = new Promise<never>((_resolve, reject) => {
      timer = setTimeout(reject, deadlines.acquireMs, new DatabaseBusyError(`No database connection within ${deadlines.acquireMs} ms.`))
    })
    try {
      return guardConnection(await Promise.race([pending, expired]), deadlines.queryMs)
    }
    catch (error) {
      // A connection that arrives after the deadline goes straight back.
      pending.then(late => late.release(), () => {})
      throw error
    }
    finally {
      clearTimeout(timer)
    }
  }

  const run = (method: Method) => async (statement: Statement, values?: QueryValues) => {
    const connection = await acquire()
    try {
      return await send(connection, method, options(statement, values))
    }
    finally {
      // A destroyed connection has left the pool already; release is then a no-op.
      connection.release()
    }
  }

  return new Proxy(pool, {
    get(target, property, receiver) {
      if (property === 'getConnection')
        return acquire
      if (property === 'query' || property === 'execute')
        return run(property)
      return Reflect.get(target, property, receiver)
    },
  })
}
