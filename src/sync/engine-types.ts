import type { MutationResult, PullResponse } from '../../shared/schemas/sync'
import type { LixiviaDatabase, OutboxEntry } from '../db/database'

// The sync engine's contract: what it needs of the network, and the status it reports to screens.

export interface SyncTransport {
  push: (body: { clientId: string, mutations: Omit<OutboxEntry, 'seq' | 'createdAt' | 'sentAt' | 'rejected'>[] }) => Promise<{ results: MutationResult[] }>
  pull: (teamId: string, since: number, limit: number) => Promise<PullResponse>
}

export type SyncState = 'idle' | 'syncing' | 'waiting' | 'signed-out' | 'error'

export interface SyncStatus {
  state: SyncState
  /** Changes on this phone the server does not have yet. */
  pending: number
  /** Conflicts and refusals that wait for the person. */
  attention: number
  lastSyncedAt: string | null
  /** The oldest unsynced change, to warn before a browser evicts old site data. */
  oldestPendingAt: string | null
  error: string | null
  /** A pull of many pages under way (a new phone's first sync): records kept so far of the total. */
  progress: SyncProgress | null
}

/** total counts what the server said was left after the latest page; a server that does not say gives received. */
export interface SyncProgress { teamId: string, received: number, total: number }

/** What the transport throws: a status (0 with no network) decides between retrying and stopping. */
export interface TransportError { status: number, message: string }

export interface SyncEngineOptions {
  database: LixiviaDatabase
  transport: SyncTransport
  teamIds: () => string[]
  onStatus?: (status: SyncStatus) => void
  batchSize?: number
  pullLimit?: number
  /** Whether the phone has signal; without it nothing is tried (the 'online' event starts a sync). */
  isOnline?: () => boolean
  /** Waits before a retry after a network error or a 5xx (1 s, doubling to 60 s). */
  schedule?: (retry: () => void, delayMs: number) => void
}
