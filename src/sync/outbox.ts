import type { EntityDataInput, EntityName } from '../../shared/schemas/entities'
import type { LixiviaDatabase, LocalRecord, OutboxEntry } from '../db/database'
import { v7 as uuidv7 } from 'uuid'
import { envelopeKeys } from '../../shared/schemas/records'

/** The record's own fields, without envelope or sync state. */
export function fieldsOf(record: object): Record<string, unknown> {
  return Object.fromEntries(Object.entries(record).filter(([key]) => !envelopeKeys.has(key) && key !== 'sync'))
}

// IndexedDB cannot store Vue proxies; a JSON copy also drops undefined fields the server would refuse.
const plain = <T>(value: T): T => JSON.parse(JSON.stringify(value)) as T
/** Equal as stored: the same JSON. */
export const same = (a: unknown, b: unknown): boolean => JSON.stringify(a ?? null) === JSON.stringify(b ?? null)

/** The newest queued mutation of a record that no push has carried yet, if any. */
async function unsentFor(database: LixiviaDatabase, id: string): Promise<OutboxEntry | undefined> {
  const queued = await database.outbox.where('id').equals(id).sortBy('seq')
  const last = queued.at(-1)
  return last && !last.sentAt && !last.rejected ? last : undefined
}

const joinReasons = (...reasons: (string | undefined)[]): string | undefined => reasons.filter(Boolean).join('; ') || undefined

/** What saving a record needs: the team, the person, the fields (all for a new record, some for an edit). */
export interface RecordSave<E extends EntityName> {
  teamId: string
  userId: string
  /** An existing record to edit; a new one (with a new UUID v7) otherwise. */
  id?: string
  data: Partial<EntityDataInput<E>>
  reason?: string
  /**
   * Queue an edit as a mutation of its own, behind everything queued so far, even when an unsent
   * one of the record could take it: for an edit that names a record queued after that one (a
   * recipe pointing at its new version), which the server must have first.
   */
  ownMutation?: boolean
}

/**
 * Saves a record on the phone and queues it for the server in one transaction: both happen or
 * neither does. A new record queues all its fields; an edit queues only what changed, folded into
 * a queued mutation no push has carried yet (one that may have reached the server is never edited).
 * A reason goes with the change into the record's history on the server.
 * @returns the record's id
 */
export async function saveRecord<E extends EntityName>(database: LixiviaDatabase, entity: E, input: RecordSave<E>): Promise<string> {
  const table = database.records[entity]
  const id = input.id ?? uuidv7()
  const data = plain(fieldsOf(input.data))
  await database.transaction('rw', table, database.outbox, async () => {
    const now = new Date().toISOString()
    const existing = await table.get(id)
    if (!existing) {
      // The server checks the fields with the entity's schema; until it answers, the phone keeps them as typed.
      const record = { ...data, id, teamId: input.teamId, createdBy: input.userId, createdAt: now, updatedAt: now, rev: null, deletedAt: null, derived: null, history: [], historyCount: 0, sync: { state: 'pending', baseRev: null } } as LocalRecord<E>
      await table.put(record)
      await database.outbox.add({ mutationId: uuidv7(), entity, op: 'put', id, teamId: input.teamId, data, baseRev: null, createdAt: now, sentAt: null })
      return
    }
    const before: Record<string, unknown> = existing
    const patch = Object.fromEntries(Object.entries(data).filter(([key, value]) => !same(value, before[key])))
    if (Object.keys(patch).length === 0)
      return
    await table.put({ ...existing, ...patch, updatedAt: now, sync: { ...existing.sync, state: 'pending' } })
    const unsent = input.ownMutation ? undefined : await unsentFor(database, id)
    const reason = joinReasons(unsent?.op === 'put' ? unsent.reason : undefined, input.reason)
    if (unsent?.op === 'put')
      await database.outbox.update(unsent.seq!, { data: { ...unsent.data, ...patch }, ...(reason ? { reason } : {}) })
    else
      await database.outbox.add({ mutationId: uuidv7(), entity, op: 'put', id, teamId: existing.teamId, data: patch, baseRev: existing.sync.baseRev, ...(reason ? { reason } : {}), createdAt: now, sentAt: null })
  })
  return id
}

/** Puts a deleted record back, as the undo of a delete. */
export type Undo = () => Promise<void>

/**
 * Deletes a record and returns its undo. One that never reached the server simply goes, with its
 * queued mutations (and, for a brew, its readings that never left the phone either); the undo puts
 * them all back. Any other keeps a tombstone here and queues the delete; its undo is a restore.
 */
export async function deleteRecord<E extends EntityName>(database: LixiviaDatabase, entity: E, id: string, options: { reason?: string } = {}): Promise<Undo> {
  const table = database.records[entity]
  let undo: Undo = async () => {}
  await database.transaction('rw', table, database.readings, database.outbox, async () => {
    const existing = await table.get(id)
    if (!existing || existing.deletedAt)
      return
    const queued = await database.outbox.where('id').equals(id).toArray()
    if (existing.rev === null && queued.every(entry => !entry.sentAt)) {
      const readings = entity === 'brew' ? (await database.readings.where('brewId').equals(id).toArray()).filter(reading => reading.rev === null) : []
      const readingEntries = readings.length ? await database.outbox.where('id').anyOf(readings.map(reading => reading.id)).toArray() : []
      const entries = [...queued, ...readingEntries]
      await database.outbox.bulkDelete(entries.map(entry => entry.seq!))
      await database.readings.bulkDelete(readings.map(reading => reading.id))
      await table.delete(id)
      undo = () => database.transaction('rw', table, database.readings, database.outbox, async () => {
        await table.put(existing)
        await database.readings.bulkPut(readings)
        await database.outbox.bulkPut(entries)
      })
      return
    }
    const now = new Date().toISOString()
    await table.put({ ...existing, deletedAt: now, updatedAt: now, sync: { ...existing.sync, state: 'pending' } })
    await database.outbox.add({ mutationId: uuidv7(), entity, op: 'delete', id, teamId: existing.teamId, baseRev: existing.sync.baseRev, ...(options.reason ? { reason: options.reason } : {}), createdAt: now, sentAt: null })
    undo = () => restoreRecord(database, entity, id, { reason: options.reason && `Undo of a delete: ${options.reason}` })
  })
  return undo
}

/**
 * Brings a deleted record back. A delete no push has carried yet is simply taken out of the
 * outbox; otherwise a restore is queued for the server.
 */
export async function restoreRecord<E extends EntityName>(database: LixiviaDatabase, entity: E, id: string, options: { reason?: string } = {}): Promise<void> {
  const table = database.records[entity]
  await database.transaction('rw', table, database.outbox, async () => {
    const existing = await table.get(id)
    if (!existing?.deletedAt)
      return
    const now = new Date().toISOString()
    const queued = (await database.outbox.where('id').equals(id).sortBy('seq')).filter(entry => !entry.rejected)
    const last = queued.at(-1)
    if (last?.op === 'delete' && !last.sentAt) {
      await database.outbox.delete(last.seq!)
      const waiting = queued.length > 1 || existing.rev === null
      await table.put({ ...existing, deletedAt: null, updatedAt: now, sync: { ...existing.sync, state: waiting ? 'pending' : 'clean' } })
      return
    }
    await table.put({ ...existing, deletedAt: null, updatedAt: now, sync: { ...existing.sync, state: 'pending' } })
    await database.outbox.add({ mutationId: uuidv7(), entity, op: 'restore', id, teamId: existing.teamId, baseRev: existing.sync.baseRev, ...(options.reason ? { reason: options.reason } : {}), createdAt: now, sentAt: null })
  })
}
