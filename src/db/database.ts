import type { Table } from 'dexie'
import type { Membership, User } from '../../shared/schemas/auth'
import type { EntityName, HistoryEntry, MutationResult } from '../../shared/schemas/entities'
import Dexie from 'dexie'

/** Who was signed in on this phone, so the app opens offline under that identity. No tokens. */
export interface CachedIdentity {
  key: 'current'
  user: User
  memberships: Membership[]
  activeTeamId: string | null
  cachedAt: string
}

/**
 * The sync state of a local record. clean: as the server has it. pending: changed here, in the
 * outbox. conflict: the server changed the same fields; both copies are kept for the person to
 * choose. rejected: the server refused; the reason is kept until the person fixes or discards it.
 */
export interface LocalSync {
  state: 'clean' | 'pending' | 'conflict' | 'rejected'
  /** The server rev this copy is based on (null: never reached the server). */
  baseRev: number | null
  reason?: string
  server?: Record<string, unknown>
}

/** A record as stored on the phone: the server's shape plus its local sync state. */
export interface LocalRecord {
  id: string
  teamId: string
  createdBy: string
  createdAt: string
  updatedAt: string
  rev: number | null
  deletedAt: string | null
  derived?: Record<string, unknown> | null
  /** Edits, deletes and restores as the server recorded them (none yet for a record new here). */
  history?: HistoryEntry[]
  sync: LocalSync
  [field: string]: unknown
}

/** One change waiting to reach the server, in the order it was made. */
export interface OutboxEntry {
  seq?: number
  mutationId: string
  entity: EntityName
  op: 'put' | 'delete' | 'restore'
  id: string
  teamId: string
  /** All fields for a new record; only the changed ones for an edit. */
  data?: Record<string, unknown>
  baseRev: number | null
  /** Why the record was changed, for its history (a teammate's brew needs one). */
  reason?: string
  createdAt: string
  /** Set when a push carrying it started: it may have reached the server, so it is never edited. */
  sentAt: string | null
  /** The server's answer when it was refused; kept until the person acts. */
  rejected?: MutationResult
}

export interface MetaEntry { key: string, value: unknown }

export const recordTables = ['instruments', 'calibrations', 'brews', 'readings', 'events', 'rounds', 'entries', 'trips', 'lots', 'recipes', 'zones'] as const
export type RecordTableName = (typeof recordTables)[number]

export const tableOf: Record<EntityName, RecordTableName> = {
  instrument: 'instruments',
  calibration: 'calibrations',
  brew: 'brews',
  reading: 'readings',
  event: 'events',
  round: 'rounds',
  entry: 'entries',
  trip: 'trips',
  lot: 'lots',
  recipe: 'recipes',
  zone: 'zones',
}

/** The one IndexedDB database of the app. Versions are only ever appended, never edited. */
export class LixiviaDatabase extends Dexie {
  identity!: Table<CachedIdentity, 'current'>
  outbox!: Table<OutboxEntry, number>
  meta!: Table<MetaEntry, string>
  instruments!: Table<LocalRecord, string>
  calibrations!: Table<LocalRecord, string>
  brews!: Table<LocalRecord, string>
  readings!: Table<LocalRecord, string>
  events!: Table<LocalRecord, string>
  rounds!: Table<LocalRecord, string>
  entries!: Table<LocalRecord, string>
  trips!: Table<LocalRecord, string>
  lots!: Table<LocalRecord, string>
  recipes!: Table<LocalRecord, string>
  zones!: Table<LocalRecord, string>

  constructor(name = 'lixivia') {
    super(name)
    this.version(1).stores({ identity: 'key' })
    this.version(2).stores({
      outbox: '++seq, id, teamId',
      meta: 'key',
      instruments: 'id, teamId, [teamId+updatedAt], sync.state',
      calibrations: 'id, teamId, instrumentId, [teamId+updatedAt], sync.state',
      brews: 'id, teamId, [teamId+brewedAt], [teamId+updatedAt], sync.state',
      readings: 'id, teamId, brewId, sync.state',
      events: 'id, teamId, [teamId+updatedAt], sync.state',
      rounds: 'id, teamId, eventId, sync.state',
      entries: 'id, teamId, roundId, sync.state',
      trips: 'id, teamId, [teamId+updatedAt], sync.state',
      lots: 'id, teamId, tripId, [teamId+updatedAt], sync.state',
      recipes: 'id, teamId, [teamId+updatedAt], sync.state',
    })
    this.version(3).stores({ zones: 'id, teamId, [teamId+updatedAt], sync.state' })
  }
}

export const db = new LixiviaDatabase()
