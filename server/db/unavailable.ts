/** Thrown when no pooled connection came free within the acquire deadline (see guard.ts). */
export class DatabaseBusyError extends Error {
  override name = 'DatabaseBusyError'
  readonly code = 'POOL_ACQUIRE_TIMEOUT'
}

/** mysql2's and the network's codes for a server that is down, gone or not answering. */
const unavailableCodes = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'EPIPE',
  'ETIMEDOUT',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
  'PROTOCOL_CONNECTION_LOST',
  'PROTOCOL_SEQUENCE_TIMEOUT',
  'PROTOCOL_ENQUEUE_AFTER_FATAL_ERROR',
  'ER_CON_COUNT_ERROR',
  'ER_SERVER_SHUTDOWN',
  'POOL_ACQUIRE_TIMEOUT',
])

/**
 * Whether an error means the database cannot be reached right now, rather than that it refused a
 * statement. Drizzle wraps the driver's error as `cause`, so the chain is followed; mysql2 marks
 * every error that breaks a connection `fatal`.
 */
export function isDatabaseUnavailable(error: unknown): boolean {
  for (let current = error, depth = 0; typeof current === 'object' && current !== null && depth < 5; depth++) {
    const { code, fatal, cause } = current as { code?: unknown, fatal?: unknown, cause?: unknown }
    if (fatal === true || (typeof code === 'string' && unavailableCodes.has(code)))
      return true
    current = cause
  }
  return false
}
