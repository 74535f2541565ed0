import type { MariaDbOptions, RunningMariaDb } from './mariadb'
import { setTimeout as sleep } from 'node:timers/promises'
import { startMariaDb } from './mariadb'

export interface RestartLimits { maxRestarts: number, windowMs: number }

export interface SupervisorHooks {
  log: (line: string) => void
  /** Called once when the server died more often than the limits allow; the caller should stop. */
  onGiveUp: (reason: string) => void
}

export interface SupervisedMariaDb {
  /** The server running now (a restart replaces it). */
  current: () => RunningMariaDb
  stop: () => Promise<void>
}

/** Enough for a rare crash (a kill, the out-of-memory killer); not a loop on a broken data folder. */
export const defaultRestartLimits: RestartLimits = { maxRestarts: 3, windowMs: 10 * 60_000 }

/**
 * Starts the private MariaDB and starts it again on the same data folder and port whenever it stops
 * without being asked to, at most `maxRestarts` times within `windowMs`. The app's pool reconnects
 * by itself; requests in between get 503.
 */
export async function superviseMariaDb(options: MariaDbOptions, hooks: SupervisorHooks, limits = defaultRestartLimits): Promise<SupervisedMariaDb> {
  let current = await startMariaDb(options)
  let stopping = false
  let restarting: Promise<void> | undefined
  const restarts: number[] = []
  const minutes = limits.windowMs / 60_000

  async function restart(how: string): Promise<void> {
    let reason = `MariaDB stopped unexpectedly (${how})`
    // `stopping` changes while a start is awaited, so it is read on each pass.
    for (;;) {
      if (stopping)
        return
      const now = Date.now()
      while (restarts.length > 0 && restarts[0]! <= now - limits.windowMs)
        restarts.shift()
      if (restarts.length >= limits.maxRestarts) {
        hooks.onGiveUp(`${reason}, after ${restarts.length} restart(s) within ${minutes} minutes. Its log is ${current.errorLog}.`)
        return
      }
      restarts.push(now)
      hooks.log(`${reason}; restarting it (${restarts.length} of at most ${limits.maxRestarts} within ${minutes} minutes) ...`)
      try {
        current = await startMariaDb(options)
      }
      catch (error) {
        reason = `MariaDB could not be started again: ${(error as Error).message}`
        await sleep(1_000)
        continue
      }
      if (stopping)
        return current.stop()
      watch(current)
      hooks.log('MariaDB is running again.')
      return
    }
  }

  function watch(server: RunningMariaDb): void {
    server.onCrash((how) => {
      restarting = restart(how)
    })
  }

  watch(current)
  return {
    current: () => current,
    async stop() {
      stopping = true
      await restarting
      await current.stop()
    },
  }
}
