import { setTimeout as sleep } from 'node:timers/promises'
import { HttpError } from '../http-error'

/** InnoDB's answers to contention: a deadlock victim, or a lock waited for too long. */
const contention = new Set(['ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT'])

/** Whether an error (or the database error it wraps, as Drizzle does) is lock contention. */
export function isContention(error: unknown): boolean {
  for (let e: unknown = error, depth = 0; e && depth < 4; e = (e as { cause?: unknown }).cause, depth++) {
    if (typeof e === 'object' && contention.has(String((e as { code?: unknown }).code)))
      return true
  }
  return false
}

/**
 * Runs a transaction again when InnoDB picked it as a deadlock victim or a lock wait timed out: the
 * whole transaction was rolled back, so running it again is safe. After the last attempt the caller
 * gets a 503 to retry later, never a 500.
 */
export async function retryOnContention<T>(run: () => Promise<T>, attempts = 5): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await run()
    }
    catch (error) {
      if (!isContention(error))
        throw error
      if (attempt >= attempts)
        throw new HttpError(503, 'busy', 'The team server is busy with other phones\' changes. Nothing was lost: your phone sends them again shortly.')
      // Spread the retries so the same transactions do not collide again at once.
      await sleep(10 * 2 ** attempt + Math.random() * 20)
    }
  }
}
