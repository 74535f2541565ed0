export type Stop = () => Promise<void>

export interface Lifecycle {
  /** Runs at shutdown, in the reverse order of registration. */
  onStop: (stop: Stop) => void
  /** Stops everything registered (once), then exits with the code. */
  shutdown: (code: number) => Promise<never>
}

/** Ctrl-C or SIGTERM stop what a start command started, last started first. */
export function lifecycle(warn: (message: string) => void = message => console.error(message)): Lifecycle {
  const stops: Stop[] = []
  let stopping = false
  const shutdown = async (code: number): Promise<never> => {
    if (!stopping) {
      stopping = true
      for (const stop of stops.reverse())
        await stop().catch(error => warn(`While stopping: ${(error as Error).message}`))
    }
    process.exit(code)
  }
  process.on('SIGINT', () => void shutdown(0))
  process.on('SIGTERM', () => void shutdown(0))
  return { onStop: stop => void stops.push(stop), shutdown }
}
