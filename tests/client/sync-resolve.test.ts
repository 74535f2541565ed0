import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { LixiviaDatabase } from '../../src/db/database'
import { createSyncEngine } from '../../src/sync/engine'
import { saveRecord } from '../../src/sync/outbox'
import { differences, discardRejected, keepMine, resendRejected, takeTheirs } from '../../src/sync/resolve'
import { fakeServer, teamId, userId } from './fake-sync-server'

let database: LixiviaDatabase
let counter = 0
beforeEach(() => {
  database = new LixiviaDatabase(`lixivia-resolve-${counter++}`)
})
afterEach(async () => {
  await database.delete()
})

const gauge = (label: string) => ({ label, readingKind: 'tds' as const, resolution: 0.01, repeatability: 0.02 })

async function conflicted() {
  const server = fakeServer()
  const engine = createSyncEngine({ database, transport: server.transport, teamIds: () => [teamId], schedule: () => {} })
  const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('Bench') })
  await engine.syncNow()
  server.editElsewhere(id, { label: 'Theirs' })
  await saveRecord(database, 'instrument', { teamId, userId, id, data: { label: 'Mine' } })
  await engine.syncNow()
  return { server, engine, id }
}

describe('resolving a conflict', () => {
  it('shows the fields that differ', async () => {
    const { id } = await conflicted()
    expect(differences((await database.instruments.get(id))!)).toEqual([{ field: 'label', mine: 'Mine', theirs: 'Theirs' }])
  })

  it('keeps mine: the phone\'s fields go out again on top of the server\'s rev', async () => {
    const { server, engine, id } = await conflicted()
    await keepMine(database, 'instrument', id)
    await engine.syncNow()
    expect(server.records.get(id)?.data.label).toBe('Mine')
    expect(await database.instruments.get(id)).toMatchObject({ label: 'Mine', sync: { state: 'clean' } })
  })

  it('takes theirs: the server\'s copy replaces the phone\'s', async () => {
    const { id } = await conflicted()
    await takeTheirs(database, 'instrument', id)
    expect(await database.instruments.get(id)).toMatchObject({ label: 'Theirs', sync: { state: 'clean', baseRev: 2 } })
    expect(await database.outbox.count()).toBe(0)
  })
})

describe('acting on a refusal', () => {
  async function refused() {
    const server = fakeServer()
    const engine = createSyncEngine({ database, transport: server.transport, teamIds: () => [teamId], schedule: () => {} })
    const id = await saveRecord(database, 'instrument', { teamId, userId, data: gauge('refuse me') })
    await engine.syncNow()
    const [entry] = await database.outbox.toArray()
    return { server, engine, id, seq: entry!.seq! }
  }

  it('sends the fixed record again', async () => {
    const { server, engine, id, seq } = await refused()
    await saveRecord(database, 'instrument', { teamId, userId, id, data: { label: 'Bench, fixed' } })
    await resendRejected(database, seq)
    await engine.syncNow()
    expect(server.records.get(id)?.data).toMatchObject({ label: 'Bench, fixed', readingKind: 'tds' })
    expect(await database.outbox.filter(entry => Boolean(entry.rejected)).count()).toBe(0)
  })

  it('discards a refused new record from the phone, only when told to', async () => {
    const { id, seq } = await refused()
    expect(await database.instruments.get(id)).toBeDefined()
    await discardRejected(database, seq)
    expect(await database.instruments.get(id)).toBeUndefined()
    expect(await database.outbox.count()).toBe(0)
  })
})
