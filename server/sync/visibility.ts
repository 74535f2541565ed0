import type { Role } from '../../shared/schemas/auth'
import type { EntityName } from '../../shared/schemas/entities'
import type { HistoryEntry } from '../../shared/schemas/records'
import type { Db } from '../db/client'
import type { RecordRow } from './store'
import { and, eq, inArray } from 'drizzle-orm'
import { can } from '../../shared/records/rules'
import { records } from '../db/schema'
import { toRecord } from './store'

// What a reader may receive of a record, in one place: blind judging keeps a cup's competitor from
// members and viewers until its round is signed off (DESIGN.md). Every path by which a record or
// its history leaves the server goes through here: pulls, answers to a push (fresh or repeated),
// the sign-off route, the full history and the results.

/** The fields of an entity kept from readers who may not see competitors (data and history alike). */
const sealedFields: Partial<Record<EntityName, readonly string[]>> = { entry: ['contestant'] }

/** The round whose sign-off opens a sealed record, or null when nothing of it is sealed. */
function roundOf(entity: string, data: Record<string, unknown>): string | null {
  return entity in sealedFields && typeof data.roundId === 'string' ? data.roundId : null
}

/** Which of these rounds are signed off, in one query. */
export async function signedOffRounds(db: Pick<Db, 'select'>, roundIds: Iterable<string>): Promise<Set<string>> {
  const ids = [...new Set(roundIds)]
  if (ids.length === 0)
    return new Set()
  const rows = await db.select({ id: records.id, derived: records.derived }).from(records).where(and(inArray(records.id, ids), eq(records.entity, 'round')))
  return new Set(rows.filter(row => row.derived).map(row => row.id))
}

/** History entries without the changes of sealed fields. */
export function sealHistory(entity: string, history: HistoryEntry[]): HistoryEntry[] {
  const fields = sealedFields[entity as EntityName] ?? []
  return history.map(entry => (fields.some(field => field in entry.changes)
    ? { ...entry, changes: Object.fromEntries(Object.entries(entry.changes).filter(([field]) => !fields.includes(field))) }
    : entry))
}

/** A record as sent (toRecord's shape) without its sealed fields or their history. */
export function sealRecord(entity: string, record: Record<string, unknown>): Record<string, unknown> {
  const fields = sealedFields[entity as EntityName] ?? []
  const kept = Object.fromEntries(Object.entries(record).filter(([key]) => !fields.includes(key)))
  return Array.isArray(record.history) ? { ...kept, history: sealHistory(entity, record.history as HistoryEntry[]) } : kept
}

/**
 * Decides for a reader which records come sealed. Rounds are looked up once per call, for all the
 * records at hand, so a page of a pull costs one extra query at most.
 */
export async function readerView(db: Pick<Db, 'select'>, role: Role, items: { entity: string, data: Record<string, unknown> }[]): Promise<(index: number) => boolean> {
  if (can.seeCompetitors(role, false))
    return () => false
  const rounds = items.map(item => roundOf(item.entity, item.data))
  const signed = await signedOffRounds(db, rounds.filter((id): id is string => id !== null))
  return index => rounds[index] !== null && !signed.has(rounds[index]!)
}

/** Rows as this reader receives them. */
export async function visibleRecords(db: Pick<Db, 'select'>, role: Role, rows: RecordRow[]): Promise<Record<string, unknown>[]> {
  const sealed = await readerView(db, role, rows)
  return rows.map((row, index) => (sealed(index) ? sealRecord(row.entity, toRecord(row)) : toRecord(row)))
}
