import type { LixiviaDatabase, UploadEntry } from '../db/database'
import type { TransportError } from './engine'

/** Sends one file; throws a TransportError (status 0 without network) when it does not go. */
export interface UploadTransport {
  put: (entry: UploadEntry, onProgress: (fraction: number) => void) => Promise<void>
}

export interface UploadStatus {
  /** Files waiting or on their way. */
  waiting: number
  /** The file on its way, and how far it is (0–1). */
  sending: { id: string, progress: number } | null
  /** Files the server refused, waiting for the person. */
  failed: number
}

/** Puts a file in the upload queue, at once and offline; a file already queued or sent stays as it is. */
export async function queueUpload(database: LixiviaDatabase, file: Pick<UploadEntry, 'id' | 'teamId' | 'path' | 'field' | 'blob' | 'fileName'>): Promise<void> {
  await database.transaction('rw', database.uploads, async () => {
    if (await database.uploads.get(file.id))
      return
    await database.uploads.add({ ...file, state: 'queued', attempts: 0, progress: 0, createdAt: new Date().toISOString() })
  })
}

/** A refused file goes back in the queue (after the person fixed what was wrong, or to try again). */
export async function retryUpload(database: LixiviaDatabase, id: string): Promise<void> {
  await database.uploads.where('id').equals(id).modify((entry) => {
    if (entry.state === 'failed')
      Object.assign(entry, { state: 'queued', error: undefined, progress: 0 })
  })
}

const isTransportError = (error: unknown): error is TransportError => typeof error === 'object' && error !== null && 'status' in error && typeof error.status === 'number'
/** No network, a server error, a timeout or too many requests: worth trying again later. */
const passing = (status: number): boolean => status === 0 || status === 408 || status === 429 || status >= 500

export interface UploaderOptions {
  database: LixiviaDatabase
  transport: UploadTransport
  onStatus?: (status: UploadStatus) => void
  /** Whether the phone has signal; without it nothing is tried (the next sync starts the queue). */
  isOnline?: () => boolean
  /** Waits before a retry after a passing failure (2 s, doubling to 2 min). */
  schedule?: (retry: () => void, delayMs: number) => void
}

/**
 * Sends queued files one at a time, oldest first. The server takes a file by its id once, so a file
 * sent again after a lost answer is stored once. A refusal (a 4xx) marks the file failed with the
 * server's reason; anything passing puts it back in the queue and tries again later.
 */
export function createUploader(options: UploaderOptions) {
  const { database, transport } = options
  const schedule = options.schedule ?? ((retry: () => void, delayMs: number) => void setTimeout(retry, delayMs))
  let running: Promise<void> | null = null
  let failures = 0
  let sending: UploadStatus['sending'] = null

  async function report(): Promise<void> {
    // Progress as it was when reported, not when the counts come back.
    const current = sending
    const [waiting, failed] = await Promise.all([database.uploads.where('state').anyOf('queued', 'sending').count(), database.uploads.where('state').equals('failed').count()])
    options.onStatus?.({ waiting, sending: current, failed })
  }

  async function sendOne(entry: UploadEntry): Promise<void> {
    await database.uploads.update(entry.id, { state: 'sending', progress: 0, attempts: entry.attempts + 1 })
    sending = { id: entry.id, progress: 0 }
    await report()
    try {
      await transport.put(entry, (fraction) => {
        sending = { id: entry.id, progress: fraction }
        void report()
      })
      await database.uploads.update(entry.id, { state: 'sent', progress: 1, sentAt: new Date().toISOString(), error: undefined })
    }
    catch (error) {
      const status = isTransportError(error) ? error.status : 0
      const message = error instanceof Error ? error.message : String(error)
      await database.uploads.update(entry.id, passing(status) || status === 401 ? { state: 'queued', progress: 0 } : { state: 'failed', progress: 0, error: message })
      if (passing(status) || status === 401)
        throw error
    }
    finally {
      sending = null
    }
  }

  async function run(): Promise<void> {
    if (!(options.isOnline?.() ?? true))
      return report()
    // A file cut off mid-way (the app closed) goes again.
    await database.uploads.where('state').equals('sending').modify({ state: 'queued', progress: 0 })
    try {
      for (;;) {
        const next = await database.uploads.where('state').equals('queued').sortBy('createdAt')
        if (!next[0])
          break
        await sendOne(next[0])
      }
      failures = 0
    }
    catch (error) {
      if (!(isTransportError(error) && error.status === 401) && (options.isOnline?.() ?? true)) {
        failures += 1
        schedule(() => void uploadNow(), Math.min(120_000, 2000 * 2 ** (failures - 1)))
      }
    }
    await report()
  }

  /** Sends what is queued; one run at a time. */
  function uploadNow(): Promise<void> {
    running ??= run().finally(() => {
      running = null
    })
    return running
  }

  return { uploadNow, refreshStatus: report }
}

export type Uploader = ReturnType<typeof createUploader>
