import type { EntityName } from '../../shared/schemas/entities'
import type { LixiviaDatabase, LocalRecord, OutboxEntry } from '../db/database'
import { v7 as uuidv7 } from 'uuid'
import { tableOf } from '../db/database'

const envelope = new Set(['id', 'teamId', 'createdBy', 'createdAt', 'updatedAt', 'rev', 'deletedAt', 'derived', 'sync', 'signedOffAt'])

/** The record's own fields, without envelope or sync state. */
export function fieldsOf(record: Record<string, unknown>): Record<string, unknown> {
  return Object.fromEntries(Object.entries(record).filter(([key]) => !envelope.has(key)))
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

/**
 * Saves a record on the phone and queues it for the server in one transaction: both happen or
 * neither does. A new record queues all its fields; an edit queues only what changed, folded into
 * a queued mutation no push has carried yet (one that may have reached the server is never edited).
 * @returns the record's id
 */
export async function saveRecord(database: LixiviaDatabase, entity: EntityName, input: { teamId: string, userId: string, id?: string, data: Record<string, unknown> }): Promise<string> {
  const table = database[tableOf[entity]]
  const id = input.id ?? uuidv7()
  const data = plain(fieldsOf(input.data))
  await database.transaction('rw', table, database.outbox, async () => {
    const now = new Date().toISOString()
    const existing = await table.get(id)
    if (!existing) {
      await table.put({ ...data, id, teamId: input.teamId, createdBy: input.userId, createdAt: now, updatedAt: now, rev: null, deletedAt: null, derived: null, sync: { state: 'pending', baseRev: null } })
      await database.outbox.add({ mutationId: uuidv7(), entity, op: 'put', id, teamId: input.teamId, data, baseRev: null, createdAt: now, sentAt: null })
      return
    }
    const patch = Object.fromEntries(Object.entries(data).filter(([key, value]) => !same(value, existing[key])))
    if (Object.keys(patch).length === 0)
      return
    await table.put({ ...existing, ...patch, updatedAt: now, sync: { ...existing.sync, state: 'pending' } })
    const unsent = await unsentFor(database, id)
    if (unsent?.op === 'put')
      await database.outbox.update(unsent.seq!, { data: { ...unsent.data, ...patch } })
    else
      await database.outbox.add({ mutationId: uuidv7(), entity, op: 'put', id, teamId: existing.teamId, data: patch, baseRev: existing.sync.baseRev, createdAt: now, sentAt: null })
  })
  return id
}

/**
 * Deletes a record. One that never reached the server simply goes, with its queued mutations; any
 * other keeps a tombstone here and queues the delete.
 */
export async function deleteRecord(database: LixiviaDatabase, entity: EntityName, id: string): Promise<void> {
  const table = database[tableOf[entity]]
  await database.transaction('rw', table, database.outbox, async () => {
    const existing: LocalRecord | undefined = await table.get(id)
    if (!existing || existing.deletedAt)
      return
    const queued = await database.outbox.where('id').equals(id).toArray()
    if (existing.rev === null && queued.every(entry => !entry.sentAt)) {
      await database.outbox.bulkDelete(queued.map(entry => entry.seq!))
      await table.delete(id)
      return
    }
    const now = new Date().toISOString()
    await table.put({ ...existing, deletedAt: now, updatedAt: now, sync: { ...existing.sync, state: 'pending' } })
    await database.outbox.add({ mutationId: uuidv7(), entity, op: 'delete', id, teamId: existing.teamId, baseRev: existing.sync.baseRev, createdAt: now, sentAt: null })
  })
}
