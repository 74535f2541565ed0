import type { Table } from 'dexie'
import type { Membership, User } from '../../shared/schemas/auth'
import type { EntityName } from '../../shared/schemas/entities'
import type { EntityRecord } from '../../shared/schemas/records'
import type { MutationResult } from '../../shared/schemas/sync'
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
export interface LocalSync<E extends EntityName = EntityName> {
  state: 'clean' | 'pending' | 'conflict' | 'rejected'
  /** The server rev this copy is based on (null: never reached the server). */
  baseRev: number | null
  reason?: string
  /** The server's copy, for a conflict. */
  server?: EntityRecord<E>
}

/** A record as stored on the phone: the server's shape (rev null until it has one) plus its sync state. */
export type LocalRecord<E extends EntityName> = Omit<EntityRecord<E>, 'rev'> & { rev: number | null, sync: LocalSync<E> }

/** The phone's copy of a record the server sent, in the given sync state. */
export function localCopy<E extends EntityName>(record: EntityRecord<E>, sync: LocalSync<E>): LocalRecord<E> {
  // A record with a server rev and a sync state is a LocalRecord (TypeScript cannot follow the spread of a generic record).
  return { ...record, sync } as LocalRecord<E>
}

/** A record of any entity, for lists that mix them. */
export type AnyLocalRecord = { [E in EntityName]: LocalRecord<E> }[EntityName]

/** One change waiting to reach the server, in the order it was made. */
export interface OutboxEntry {
  seq?: number
  mutationId: string
  entity: EntityName
  op: 'put' | 'delete' | 'restore'
  id: string
  teamId: string
  /** All fields for a new record; only the changed ones for an edit (checked by the server). */
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

/**
 * A file waiting to reach the server (a photo), with its own queue beside the outbox: its bytes
 * stay here as a blob, it goes with an idempotent PUT by its id, and its record syncs as any other.
 * queued: waits for signal. sending: on its way (progress 0–1). sent: the server has it (the blob
 * stays as the phone's copy). failed: refused for good; the reason waits for the person.
 */
export interface UploadEntry {
  /** The file's own id, made on the phone (a UUID v7); the server stores it under this id. */
  id: string
  teamId: string
  /** The PUT's path under /api/v1, and the multipart field that carries the bytes. */
  path: string
  field: string
  blob: Blob
  fileName: string
  state: 'queued' | 'sending' | 'sent' | 'failed'
  attempts: number
  progress: number
  error?: string
  createdAt: string
  sentAt?: string
}

/** A teammate's photo, fetched from the team server and kept on this phone. */
export interface PhotoFile {
  id: string
  teamId: string
  blob: Blob
  fetchedAt: string
}

/** Each entity's table, typed by its record. */
export type RecordTables = { [E in EntityName]: Table<LocalRecord<E>, string> }

export const tableOf = {
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
  zoneDefault: 'zoneDefaults',
  signoff: 'signoffs',
  zeroCheck: 'zeroChecks',
  cuppingTable: 'cuppingTables',
  scoreSheet: 'scoreSheets',
  score: 'scores',
  photo: 'photos',
  recipeVersion: 'recipeVersions',
  houseRecipe: 'houseRecipes',
  dialIn: 'dialIns',
} as const satisfies Record<EntityName, string>
export type RecordTableName = (typeof tableOf)[EntityName]

/** The one IndexedDB database of the app. Versions are only ever appended, never edited. */
export class LixiviaDatabase extends Dexie {
  identity!: Table<CachedIdentity, 'current'>
  outbox!: Table<OutboxEntry, number>
  meta!: Table<MetaEntry, string>
  instruments!: RecordTables['instrument']
  calibrations!: RecordTables['calibration']
  brews!: RecordTables['brew']
  readings!: RecordTables['reading']
  events!: RecordTables['event']
  rounds!: RecordTables['round']
  entries!: RecordTables['entry']
  trips!: RecordTables['trip']
  lots!: RecordTables['lot']
  recipes!: RecordTables['recipe']
  zones!: RecordTables['zone']
  zoneDefaults!: RecordTables['zoneDefault']
  signoffs!: RecordTables['signoff']
  zeroChecks!: RecordTables['zeroCheck']
  recipeVersions!: RecordTables['recipeVersion']
  houseRecipes!: RecordTables['houseRecipe']
  dialIns!: RecordTables['dialIn']
  uploads!: Table<UploadEntry, string>
  cuppingTables!: RecordTables['cuppingTable']
  scoreSheets!: RecordTables['scoreSheet']
  scores!: RecordTables['score']
  photos!: RecordTables['photo']
  /** Photos this phone did not take, kept once fetched so they show without signal. */
  photoFiles!: Table<PhotoFile, string>
  /** The record tables by entity, for code that handles any entity. */
  readonly records: RecordTables

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
    // Files get their own queue, team default zones their table; records now carry their latest history only and a round's
    // sign-off in `derived`, so every team is pulled again from the start (local changes stay).
    this.version(4).stores({ uploads: 'id, teamId, state, createdAt', zoneDefaults: 'id, teamId, sync.state' }).upgrade(async (tx) => {
      await tx.table('meta').where('key').startsWith('cursor:').delete()
    })
    // Competition judging: a round's sign-off queued on the phone, and each instrument's daily zero check.
    this.version(5).stores({ signoffs: 'id, teamId, roundId, sync.state', zeroChecks: 'id, teamId, instrumentId, sync.state' })
    // Buying trips at origin: cupping tables, score sheets and scores, photos and the photos fetched from teammates.
    this.version(6).stores({
      cuppingTables: 'id, teamId, tripId, sync.state',
      scoreSheets: 'id, teamId, sync.state',
      scores: 'id, teamId, tableId, sync.state',
      photos: 'id, teamId, tripId, lotId, brewId, sync.state',
      photoFiles: 'id, teamId',
    })
    // Recipe versions, the crew's house marks and dial-in sessions (an attempt is a brew whose
    // context names its session, so brews need no new index). An older version skipped these
    // records, and brews whose context names a version or a session, as unreadable: every team is
    // pulled again from the start (local changes stay).
    this.version(7).stores({ recipeVersions: 'id, teamId, recipeId, sync.state', houseRecipes: 'id, teamId, sync.state', dialIns: 'id, teamId, recipeId, sync.state' }).upgrade(async (tx) => {
      await tx.table('meta').where('key').startsWith('cursor:').delete()
    })
    // A year of brews on a phone: the Ledger pages and filters them through indexes (method, kind
    // of context, deleted), and the workflows find their brews by the record they were measured
    // for. A brew not deleted has no deletedAt key, so the deleted ones are a small index of their own;
    // a brew's two figures are an index too, so the chart reads a year of them as keys only.
    this.version(20).stores({
      brews: 'id, teamId, [teamId+brewedAt], [teamId+updatedAt], sync.state, [teamId+method+brewedAt], [teamId+context.kind+brewedAt], [teamId+deletedAt], context.refId, context.sessionId, [teamId+derived.tdsPercent+derived.yieldPercent]',
    })
    this.records = {
      instrument: this.instruments,
      calibration: this.calibrations,
      brew: this.brews,
      reading: this.readings,
      event: this.events,
      round: this.rounds,
      entry: this.entries,
      trip: this.trips,
      lot: this.lots,
      recipe: this.recipes,
      zone: this.zones,
      zoneDefault: this.zoneDefaults,
      signoff: this.signoffs,
      zeroCheck: this.zeroChecks,
      cuppingTable: this.cuppingTables,
      scoreSheet: this.scoreSheets,
      score: this.scores,
      photo: this.photos,
      recipeVersion: this.recipeVersions,
      houseRecipe: this.houseRecipes,
      dialIn: this.dialIns,
    }
  }

  /** Every record table, for transactions that may touch any of them. */
  get recordTables(): Table[] {
    return Object.values(this.records)
  }
}

export const db = new LixiviaDatabase()
