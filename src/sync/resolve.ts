import type { EntityName } from '../../shared/schemas/entities'
import type { LixiviaDatabase, OutboxEntry } from '../db/database'
import { v7 as uuidv7 } from 'uuid'
import { localCopy } from '../db/database'
import { fieldsOf, same } from './outbox'

const tablesOf = (database: LixiviaDatabase) => [database.outbox, database.meta, ...database.recordTables]

/** The fields where the phone's copy and the server's differ, for showing a conflict. */
export function differences(record: object & { sync: { server?: object } }): { field: string, mine: unknown, theirs: unknown }[] {
  const mine = fieldsOf(record)
  const theirs = record.sync.server ? fieldsOf(record.sync.server) : {}
  return [...new Set([...Object.keys(mine), ...Object.keys(theirs)])]
    .filter(field => !same(mine[field], theirs[field]))
    .map(field => ({ field, mine: mine[field], theirs: theirs[field] }))
}

/** Conflict → keep the phone's copy: its differing fields go out again, based on the server's rev. */
export async function keepMine<E extends EntityName>(database: LixiviaDatabase, entity: E, id: string): Promise<void> {
  const table = database.records[entity]
  await database.transaction('rw', tablesOf(database), async () => {
    const record = await table.get(id)
    if (!record || record.sync.state !== 'conflict' || !record.sync.server)
      return
    const serverRev = record.sync.server.rev
    const patch = Object.fromEntries(differences(record).map(({ field, mine }) => [field, mine ?? null]))
    await table.put({ ...record, sync: { state: 'pending', baseRev: serverRev } })
    await database.outbox.add({ mutationId: uuidv7(), entity, op: 'put', id, teamId: record.teamId, data: patch, baseRev: serverRev, createdAt: new Date().toISOString(), sentAt: null })
  })
}

/** Conflict → take the server's copy; the phone's version of those fields is given up. */
export async function takeTheirs<E extends EntityName>(database: LixiviaDatabase, entity: E, id: string): Promise<void> {
  const table = database.records[entity]
  await database.transaction('rw', tablesOf(database), async () => {
    const record = await table.get(id)
    const server = record?.sync.server
    if (!record || record.sync.state !== 'conflict' || !server)
      return
    await table.put(localCopy(server, { state: 'clean', baseRev: server.rev }))
  })
}

/** Takes a refused change out of the outbox, and says what it was about. Call in a transaction. */
async function takeRefused(database: LixiviaDatabase, seq: number) {
  const entry = await database.outbox.get(seq)
  if (!entry?.rejected)
    return undefined
  await database.outbox.delete(seq)
  return entry
}

/** Refused → send the record as it now is on the phone (after the person fixed it). */
export async function resendRejected(database: LixiviaDatabase, seq: number): Promise<void> {
  await database.transaction('rw', tablesOf(database), async () => {
    const entry = await takeRefused(database, seq)
    if (entry)
      await resend(database, entry.entity, entry)
  })
}

async function resend<E extends EntityName>(database: LixiviaDatabase, entity: E, entry: OutboxEntry): Promise<void> {
  const table = database.records[entity]
  const record = await table.get(entry.id)
  if (record) {
    await table.put({ ...record, sync: { state: 'pending', baseRev: record.sync.baseRev } })
    await database.outbox.add({
      mutationId: uuidv7(),
      entity,
      op: entry.op,
      id: entry.id,
      teamId: entry.teamId,
      data: entry.op === 'put' ? fieldsOf(record) : undefined,
      baseRev: record.sync.baseRev,
      ...(entry.reason ? { reason: entry.reason } : {}),
      createdAt: new Date().toISOString(),
      sentAt: null,
    })
  }
}

/**
 * Refused → give the change up. A record the server never had goes; one it has is fetched again
 * (the team's pull cursor steps back to just before the rev the phone last had).
 */
export async function discardRejected(database: LixiviaDatabase, seq: number): Promise<void> {
  await database.transaction('rw', tablesOf(database), async () => {
    const entry = await takeRefused(database, seq)
    if (entry)
      await giveUp(database, entry.entity, entry)
  })
}

async function giveUp<E extends EntityName>(database: LixiviaDatabase, entity: E, entry: OutboxEntry): Promise<void> {
  const table = database.records[entity]
  const record = await table.get(entry.id)
  if (record) {
    if (record.rev === null) {
      const rest = await database.outbox.where('id').equals(entry.id).toArray()
      await database.outbox.bulkDelete(rest.map(other => other.seq!))
      await table.delete(entry.id)
      return
    }
    await table.put({ ...record, sync: { state: 'clean', baseRev: record.sync.baseRev } })
    const cursorKey = `cursor:${record.teamId}`
    const cursor = Number((await database.meta.get(cursorKey))?.value ?? 0)
    await database.meta.put({ key: cursorKey, value: Math.min(cursor, Math.max(0, (record.sync.baseRev ?? 1) - 1)) })
  }
}
