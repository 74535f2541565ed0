import type { SyncStatus } from '../../src/sync/engine'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { LixiviaDatabase } from '../../src/db/database'
import { createSyncEngine } from '../../src/sync/engine'
import { fakeServer, teamId } from './fake-sync-server'

let database: LixiviaDatabase
let counter = 0
beforeEach(() => {
  database = new LixiviaDatabase(`lixivia-pages-${counter++}`)
})
afterEach(async () => {
  await database.delete()
})

/** A server holding `n` refractometers another phone made, one rev each. */
function serverWith(n: number) {
  const server = fakeServer()
  for (let i = 1; i <= n; i++)
    server.records.set(`0190a8c4-0000-7000-8000-${String(i).padStart(12, '0')}`, { rev: i, data: { label: `Bench ${i}`, readingKind: 'tds', resolution: 0.01, repeatability: 0.02 }, deleted: false })
  return server
}

function engineOn(server: ReturnType<typeof fakeServer>) {
  const seen: SyncStatus[] = []
  const engine = createSyncEngine({ database, transport: server.transport, teamIds: () => [teamId], onStatus: s => seen.push(s), schedule: () => {}, pullLimit: 10 })
  return { engine, seen }
}

describe('a pull of many pages', () => {
  it('shows how far it has come as "n of m", and clears that when done', async () => {
    const server = serverWith(25)
    const { engine, seen } = engineOn(server)
    await engine.syncNow()
    const steps = seen.flatMap(status => (status.progress ? [[status.progress.received, status.progress.total]] : []))
    expect(steps).toEqual([[10, 25], [20, 25]])
    expect(engine.status().progress).toBeNull()
    expect(await database.instruments.count()).toBe(25)
  })

  it('resumes after a dropped connection from the last page it kept, asking for nothing twice', async () => {
    const server = serverWith(25)
    const { engine } = engineOn(server)
    server.dropAfterPages(2)
    await engine.syncNow()
    expect(engine.status().state).toBe('waiting')
    expect(engine.status().progress).toBeNull()
    expect(await database.instruments.count()).toBe(20)
    expect((await database.meta.get(`cursor:${teamId}`))?.value).toBe(20)

    server.dropAfterPages(Infinity)
    await engine.syncNow()
    expect(server.pulls).toEqual([0, 10, 20])
    expect(await database.instruments.count()).toBe(25)
    expect(engine.status().state).toBe('idle')
  })
})
