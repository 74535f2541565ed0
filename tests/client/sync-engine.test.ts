import type { SyncStatus } from '../../src/sync/engine'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { LixiviaDatabase } from '../../src/db/database'
import { createSyncEngine } from '../../src/sync/engine'
import { deleteRecord, restoreRecord, saveRecord } from '../../src/sync/outbox'
import { fakeServer, teamId, userId } from './fake-sync-server'

let database: LixiviaDatabase
let counter = 0
beforeEach(() => {
  database = new LixiviaDatabase(`lixivia-test-${counter++}`)
})
afterEach(async () => {
  await database.delete()
})

const gauge = (label: string) => ({ label, readingKind: 'tds' as const, resolution: 0.01, repeatability: 0.02 })

function engineWith(server: ReturnType<typeof fakeServer>, delays: number[] = []) {
  const seen: SyncStatus[] = []
  const engine = createSyncEngine({ database, transport: server.transport, teamIds: () => [teamId], onStatus: s => seen.push(s), schedule: (_retry, delay) => delays.push(delay) })
  return { engine, seen }
}

describe('saveRecord and deleteRecord', () => {
  it('write the record and its mutation together, and fold unsent edits into one mutation', async () => {
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench A') })
    await saveRecord(database, 'instrument', { teamId, userId, id, data: { ...gauge('Bench A'), repeatability: 0.03 } })
    const queued = await database.outbox.toArray()
    expect(queued).toHaveLength(1)
    expect(queued[0]).toMatchObject({ op: 'put', baseRev: null, data: { label: 'Bench A', repeatability: 0.03 } })
    expect(await database.instruments.get(id)).toMatchObject({ label: 'Bench A', repeatability: 0.03, sync: { state: 'pending' } })
  })

  it('never edit a mutation a push may already have delivered', async () => {
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench B') })
    await database.outbox.toCollection().modify({ sentAt: new Date().toISOString() })
    await saveRecord(database, 'instrument', { teamId, userId, id, data: { label: 'Bench B2' } })
    const queued = await database.outbox.orderBy('seq').toArray()
    expect(queued.map(entry => entry.data)).toEqual([gauge('Bench B'), { label: 'Bench B2' }])
  })

  it('drop a record that never reached the server, with its queue', async () => {
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Typo') })
    await deleteRecord(database, 'instrument', id)
    expect(await database.instruments.get(id)).toBeUndefined()
    expect(await database.outbox.count()).toBe(0)
  })

  it('drop a brew that never left the phone together with its readings, and undo it whole', async () => {
    const brewId = await saveRecord(database, 'brew', { teamId, userId, data: { method: 'percolation', notes: 'test pour' } })
    const readingId = await saveRecord(database, 'reading', { teamId, userId, data: { brewId, value: 1.35, kind: 'tds' } })
    const before = await database.outbox.orderBy('seq').toArray()
    const undo = await deleteRecord(database, 'brew', brewId)
    expect(await database.readings.get(readingId)).toBeUndefined()
    expect(await database.outbox.count()).toBe(0)
    await undo()
    expect(await database.brews.get(brewId)).toMatchObject({ notes: 'test pour', deletedAt: null })
    expect(await database.readings.get(readingId)).toMatchObject({ value: 1.35 })
    expect(await database.outbox.orderBy('seq').toArray()).toEqual(before)
  })

  it('undo a delete of a synced record by taking the unsent delete back', async () => {
    const server = fakeServer()
    const { engine } = engineWith(server)
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench J') })
    await engine.syncNow()
    const undo = await deleteRecord(database, 'instrument', id, { reason: 'sold' })
    expect(await database.outbox.toArray()).toEqual([expect.objectContaining({ op: 'delete', reason: 'sold' })])
    await undo()
    expect(await database.outbox.count()).toBe(0)
    expect(await database.instruments.get(id)).toMatchObject({ deletedAt: null, sync: { state: 'clean' } })
  })

  it('undo a delete the server already has with a restore', async () => {
    const server = fakeServer()
    const { engine } = engineWith(server)
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench K') })
    await engine.syncNow()
    const undo = await deleteRecord(database, 'instrument', id, { reason: 'sold' })
    await engine.syncNow()
    expect(server.records.get(id)?.deleted).toBe(true)
    await undo()
    expect(await database.outbox.toArray()).toEqual([expect.objectContaining({ op: 'restore', reason: 'Undo of a delete: sold' })])
    await engine.syncNow()
    expect(server.records.get(id)?.deleted).toBe(false)
    expect(await database.instruments.get(id)).toMatchObject({ deletedAt: null, sync: { state: 'clean', baseRev: 3 } })
  })

  it('leave a record that is not deleted alone on restore', async () => {
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench L') })
    await restoreRecord(database, 'instrument', id)
    expect(await database.outbox.count()).toBe(1)
  })

  it('carry the reason of an edit, joined when edits fold together', async () => {
    const server = fakeServer()
    const { engine } = engineWith(server)
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench M') })
    await engine.syncNow()
    await saveRecord(database, 'instrument', { teamId, userId, id, data: { label: 'Bench M1' }, reason: 'typo' })
    await saveRecord(database, 'instrument', { teamId, userId, id, data: { notes: 'lens cleaned' }, reason: 'service' })
    expect(await database.outbox.toArray()).toEqual([expect.objectContaining({ reason: 'typo; service', data: { label: 'Bench M1', notes: 'lens cleaned' } })])
    await engine.syncNow()
    expect(server.pushes.at(-1)).toMatchObject({ mutations: [expect.objectContaining({ reason: 'typo; service' })] })
  })
})

describe('createSyncEngine', () => {
  it('pushes the outbox and marks records clean with the server\'s rev', async () => {
    const server = fakeServer()
    const { engine, seen } = engineWith(server)
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench C') })
    await engine.syncNow()
    expect(await database.outbox.count()).toBe(0)
    expect(await database.instruments.get(id)).toMatchObject({ rev: 1, sync: { state: 'clean', baseRev: 1 } })
    expect(seen.at(-1)).toMatchObject({ state: 'idle', pending: 0, attention: 0 })
  })

  it('sends a record saved while a pull is on its way in a run right after, without waiting for a timer', async () => {
    const server = fakeServer()
    const { engine } = engineWith(server)
    const first = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Cup scale') })
    const pull = server.transport.pull
    let second = ''
    let followUp: Promise<void> = Promise.resolve()
    // The second cup is saved (and syncNow called) after the push, while the pull is in flight.
    server.transport.pull = async (...args) => {
      if (!second) {
        second = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Cup scale 2') })
        followUp = engine.syncNow()
      }
      return pull(...args)
    }
    await engine.syncNow()
    await followUp
    expect(server.records.has(first)).toBe(true)
    expect(server.records.has(second)).toBe(true)
    expect(await database.outbox.count()).toBe(0)
  })

  it('bases an edit queued behind an in-flight create on the rev the create got', async () => {
    const server = fakeServer()
    const { engine } = engineWith(server)
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench D') })
    await database.outbox.toCollection().modify({ sentAt: new Date().toISOString() })
    await saveRecord(database, 'instrument', { teamId, userId, id, data: { label: 'Bench D, recalibrated' } })
    await engine.syncNow()
    expect(server.records.get(id)?.data.label).toBe('Bench D, recalibrated')
    expect(await database.instruments.get(id)).toMatchObject({ sync: { state: 'clean', baseRev: 2 } })
  })

  it('keeps both copies of a conflict for the person to choose', async () => {
    const server = fakeServer()
    const { engine, seen } = engineWith(server)
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench E') })
    await engine.syncNow()
    server.editElsewhere(id, { label: 'Renamed on another phone' })
    await saveRecord(database, 'instrument', { teamId, userId, id, data: { label: 'Renamed here' } })
    await engine.syncNow()
    const record = await database.instruments.get(id)
    expect(record).toMatchObject({ label: 'Renamed here', sync: { state: 'conflict', server: { label: 'Renamed on another phone' } } })
    expect(seen.at(-1)).toMatchObject({ pending: 0, attention: 1 })
  })

  it('keeps a refused change with its reason, and still sends the ones behind it', async () => {
    const server = fakeServer()
    const { engine, seen } = engineWith(server)
    const refused = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('refuse me') })
    const fine = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench F') })
    await engine.syncNow()
    expect(await database.instruments.get(refused)).toMatchObject({ sync: { state: 'rejected', reason: 'label: refused by the fake' } })
    expect((await database.outbox.toArray())[0]).toMatchObject({ id: refused, rejected: { status: 'rejected' } })
    expect(server.records.has(fine)).toBe(true)
    expect(seen.at(-1)).toMatchObject({ pending: 0, attention: 1 })
    // A later sync does not send the refused change again on its own.
    const pushesBefore = server.pushes.length
    await engine.syncNow()
    expect(server.pushes.length).toBe(pushesBefore)
  })

  it('waits and retries with growing delays when there is no network, losing nothing', async () => {
    const server = fakeServer()
    const delays: number[] = []
    const { engine, seen } = engineWith(server, delays)
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench G') })
    server.setOffline(true)
    await engine.syncNow()
    await engine.syncNow()
    expect(delays).toEqual([1000, 2000])
    expect(seen.at(-1)).toMatchObject({ state: 'waiting', pending: 1 })
    expect((await database.outbox.toArray())[0]!.sentAt).toBeNull()
    server.setOffline(false)
    await engine.syncNow()
    expect(server.records.get(id)?.data.label).toBe('Bench G')
  })

  it('pulls the team\'s changes after its cursor, without overwriting local edits', async () => {
    const server = fakeServer()
    const { engine } = engineWith(server)
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench H') })
    await engine.syncNow()
    server.editElsewhere(id, { notes: 'lens replaced' })
    await engine.syncNow()
    expect(await database.instruments.get(id)).toMatchObject({ notes: 'lens replaced', sync: { state: 'clean', baseRev: 2 } })
    expect((await database.meta.get(`cursor:${teamId}`))?.value).toBe(2)
  })

  it('counts what the person did: a brew and its readings are one change waiting', async () => {
    const { engine, seen } = engineWith(fakeServer())
    const brewId = await saveRecord(database, 'brew', { teamId, userId, data: { context: { kind: 'quick', refId: null }, method: 'percolation', strengthSource: 'direct', dose: 15, beverageMass: 240, brewedAt: '2026-12-02T08:00:00.000Z' } })
    for (const value of [1.34, 1.35, 1.36])
      await saveRecord(database, 'reading', { teamId, userId, data: { brewId, value, kind: 'tds', takenAt: '2026-12-02T08:00:00.000Z' } })
    await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench I') })
    await engine.refreshStatus()
    expect(seen.at(-1)).toMatchObject({ pending: 2 })
  })

  it('keeps the time of the last sync on the phone, for the next start offline', async () => {
    const server = fakeServer()
    await engineWith(server).engine.syncNow()
    const first = (await database.meta.get('lastSyncedAt'))?.value
    expect(typeof first).toBe('string')
    const { engine, seen } = engineWith(server)
    await engine.refreshStatus()
    expect(seen.at(-1)?.lastSyncedAt).toBe(first)
  })

  it('tries nothing without signal, and spends no retry on it', async () => {
    const server = fakeServer()
    const delays: number[] = []
    const seen: SyncStatus[] = []
    const engine = createSyncEngine({ database, transport: server.transport, teamIds: () => [teamId], isOnline: () => false, onStatus: s => seen.push(s), schedule: (_retry, delay) => delays.push(delay) })
    await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench J') })
    await engine.syncNow()
    expect(server.pushes).toEqual([])
    expect(delays).toEqual([])
    expect(seen.at(-1)).toMatchObject({ state: 'waiting', pending: 1, error: null })
  })
})
