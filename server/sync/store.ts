import type { EntityData, EntityName } from '../../shared/schemas/entities'
import type { HistoryEntry } from '../../shared/schemas/records'
import type { Db } from '../db/client'
import { eq, inArray, sql } from 'drizzle-orm'
import { recordHistory, records, teamSyncState } from '../db/schema'

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]
export type RecordRow = typeof records.$inferSelect
/** A row whose data is known to be of one entity: it passed that entity's schema when written. */
export type StoredRow<E extends EntityName> = Omit<RecordRow, 'data'> & { entity: E, data: EntityData<E> }

const typed = <E extends EntityName>(row: RecordRow): StoredRow<E> => row as StoredRow<E>

/** How many history entries a record carries to phones; `record_history` keeps every one. */
export const historyShown = 20

const iso = (date: Date | null): string | null => (date ? date.toISOString() : null)

/** What phones receive: the data, the envelope, what the server derived, and the latest history. */
export function toRecord(row: RecordRow): Record<string, unknown> {
  return {
    ...row.data,
    id: row.id,
    teamId: row.teamId,
    createdBy: row.createdBy,
    createdAt: iso(row.createdAt),
    updatedAt: iso(row.updatedAt),
    rev: row.rev,
    deletedAt: iso(row.deletedAt),
    derived: row.derived ?? null,
    history: row.history ?? [],
    historyCount: row.historyCount,
  }
}

/**
 * Locks the team's counter row until the transaction ends, and returns its last rev. The row is
 * made with the team, so this takes one row lock and no gap lock: pushes to one team queue here,
 * pushes to other teams pass.
 */
export async function lockCounter(tx: Tx, teamId: string): Promise<number> {
  const [state] = await tx.select().from(teamSyncState).where(eq(teamSyncState.teamId, teamId)).for('update')
  if (state)
    return state.lastRev
  // A team made before counters came with teams (the migration gives every team one; this is a guard).
  await tx.insert(teamSyncState).values({ teamId, lastRev: 0 }).onDuplicateKeyUpdate({ set: { teamId } })
  const [made] = await tx.select().from(teamSyncState).where(eq(teamSyncState.teamId, teamId)).for('update')
  return made!.lastRev
}

/**
 * One push's view of the records: rows read once (those it changes locked) and cached, changes
 * buffered and written together at the end, so a batch costs a few queries, not several per mutation.
 */
export class RecordBatch {
  private readonly rows = new Map<string, RecordRow | null>()
  private readonly fresh = new Set<string>()
  private readonly changed = new Set<string>()
  private readonly history = new Map<string, { recordId: string, rev: number, entry: HistoryEntry }>()

  constructor(readonly tx: Tx) {}

  /** Reads and locks every record the batch changes, in one query. */
  async preload(ids: string[]): Promise<void> {
    const wanted = [...new Set(ids)].filter(id => !this.rows.has(id))
    if (wanted.length === 0)
      return
    const found = await this.tx.select().from(records).where(inArray(records.id, wanted)).for('update')
    const byId = new Map(found.map(row => [row.id, row]))
    for (const id of wanted)
      this.rows.set(id, byId.get(id) ?? null)
  }

  /** A record by id as this batch sees it, of the given entity only. */
  async find<E extends EntityName>(entity: E, id: string): Promise<StoredRow<E> | undefined> {
    if (!this.rows.has(id)) {
      const [row] = await this.tx.select().from(records).where(eq(records.id, id))
      this.rows.set(id, row ?? null)
    }
    const row = this.rows.get(id)
    return row && row.entity === entity ? typed<E>(row) : undefined
  }

  /** A record by id whatever its entity (to refuse an id that names another kind of record). */
  async any(id: string): Promise<RecordRow | undefined> {
    await this.preload([id])
    return this.rows.get(id) ?? undefined
  }

  isNew(id: string): boolean {
    return this.fresh.has(id)
  }

  /** The new records of an entity this batch holds. */
  created<E extends EntityName>(entity: E): StoredRow<E>[] {
    return [...this.fresh].map(id => this.rows.get(id)!).filter(row => row.entity === entity).map(row => typed<E>(row))
  }

  /** A new or changed row, written at flush. */
  write(row: RecordRow | StoredRow<EntityName>): void {
    if (!this.rows.get(row.id))
      this.fresh.add(row.id)
    else if (!this.fresh.has(row.id))
      this.changed.add(row.id)
    this.rows.set(row.id, row)
  }

  /**
   * Adds a history entry to a record: folded into the entry of the same rev when there is one (a
   * brew's edit and the result it moved), else appended. The record carries the latest
   * `historyShown`; every entry goes to record_history.
   */
  note<R extends RecordRow | StoredRow<EntityName>>(row: R, entry: HistoryEntry): R {
    const list = row.history ?? []
    const last = list.at(-1)
    const merged = last?.rev === entry.rev ? { ...last, changes: { ...last.changes, ...entry.changes } } : entry
    const history = (last?.rev === entry.rev ? [...list.slice(0, -1), merged] : [...list, merged]).slice(-historyShown)
    this.history.set(`${row.id}:${entry.rev}`, { recordId: row.id, rev: entry.rev, entry: merged })
    return { ...row, history, historyCount: row.historyCount + (last?.rev === entry.rev ? 0 : 1) }
  }

  /** Writes what the batch changed: multi-row inserts of 500 at most, one update per changed row. */
  async flush(): Promise<void> {
    const inserts = [...this.fresh].map(id => this.rows.get(id)!)
    for (let i = 0; i < inserts.length; i += 500)
      await this.tx.insert(records).values(inserts.slice(i, i + 500))
    for (const id of this.changed) {
      const { id: _id, entity: _entity, teamId: _team, createdBy: _by, createdAt: _at, ...changes } = this.rows.get(id)!
      await this.tx.update(records).set(changes).where(eq(records.id, id))
    }
    const entries = [...this.history.values()]
    for (let i = 0; i < entries.length; i += 500)
      await this.tx.insert(recordHistory).values(entries.slice(i, i + 500)).onDuplicateKeyUpdate({ set: { entry: sql`VALUES(${recordHistory.entry})` } })
    this.fresh.clear()
    this.changed.clear()
    this.history.clear()
  }
}
