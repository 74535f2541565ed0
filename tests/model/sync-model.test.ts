import type { Express } from 'express'
import type { SyncTransport } from '../../src/sync/engine'
import type { Account } from '../server/auth-helpers'
import type { TestDatabase } from '../server/helpers'
import { and, eq, sql } from 'drizzle-orm'
import fc from 'fast-check'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { memberships, records, syncMutations } from '../../server/db/schema'
import { LixiviaDatabase } from '../../src/db/database'
import { createSyncEngine } from '../../src/sync/engine'
import { deleteRecord, saveRecord } from '../../src/sync/outbox'
import { bearer, register } from '../server/auth-helpers'
import { buildTestApp, createTestDatabase } from '../server/helpers'

/** How a delivery goes wrong: never sent, sent but the answer lost (as when the server restarts after its commit), or sent twice. */
type Fault = 'none' | 'drop-request' | 'drop-response' | 'duplicate'

class NoNetwork extends Error {
  readonly status = 0
}

type Command
  = | { kind: 'create', phone: number, label: string }
    | { kind: 'edit', phone: number, pick: number, field: 'label' | 'notes', value: string }
    | { kind: 'delete', phone: number, pick: number }
    | { kind: 'sync', phone: number, fault: Fault }

const phoneIndex = fc.integer({ min: 0, max: 2 })
const word = fc.constantFrom('Bench', 'Harbour', 'Kiln', 'Ridge', 'Saltmarsh', 'Tern')
const command: fc.Arbitrary<Command> = fc.oneof(
  fc.record({ kind: fc.constant('create' as const), phone: phoneIndex, label: word }),
  fc.record({ kind: fc.constant('edit' as const), phone: phoneIndex, pick: fc.nat(20), field: fc.constantFrom('label' as const, 'notes' as const), value: word }),
  fc.record({ kind: fc.constant('delete' as const), phone: phoneIndex, pick: fc.nat(20) }),
  fc.record({ kind: fc.constant('sync' as const), phone: phoneIndex, fault: fc.constantFrom<Fault>('none', 'none', 'drop-request', 'drop-response', 'duplicate') }),
)

let database: TestDatabase
let app: Express
let people: Account[]
let run = 0

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
  people = [await register(app, 'Lead'), await register(app, 'Member'), await register(app, 'Viewer')]
})
afterAll(async () => {
  await database.drop()
})

/** A phone: its own IndexedDB, its own engine, a transport that can be told to fail once. */
function phone(account: Account, teamId: string) {
  const local = new LixiviaDatabase(`model-${run}-${account.id}`)
  let fault: Fault = 'none'
  const transport: SyncTransport = {
    async push(body) {
      const current = fault
      fault = 'none'
      if (current === 'drop-request')
        throw new NoNetwork('request lost')
      const send = () => request(app).post('/api/v1/sync/push').set(...bearer(account)).send(body)
      let response = await send()
      if (current === 'duplicate')
        response = await send()
      if (current === 'drop-response')
        throw new NoNetwork('answer lost after the server committed')
      expect(response.status).toBe(200)
      return response.body
    },
    async pull(team, since, limit) {
      const response = await request(app).get('/api/v1/sync/pull').query({ teamId: team, since, limit }).set(...bearer(account))
      expect(response.status).toBe(200)
      return response.body
    },
  }
  const engine = createSyncEngine({ database: local, transport, teamIds: () => [teamId], schedule: () => {}, pullLimit: 7, batchSize: 3 })
  return { account, local, engine, failNext: (next: Fault) => (fault = next) }
}

const visible = (records: Record<string, unknown>[]) => records.filter(r => !r.deletedAt)

describe('sync under dropped, repeated and lost deliveries', () => {
  it('converges every phone on the server, applies each mutation once and keeps every refusal and conflict visible', async () => {
    await fc.assert(fc.asyncProperty(fc.array(command, { minLength: 4, maxLength: 24 }), async (commands) => {
      run += 1
      const teamId = (await request(app).post('/api/v1/teams').set(...bearer(people[0]!)).send({ name: `Model crew ${run}` })).body.team.id as string
      await database.db.insert(memberships).values([{ teamId, userId: people[1]!.id, role: 'member' }, { teamId, userId: people[2]!.id, role: 'viewer' }])
      const phones = people.map(account => phone(account, teamId))

      for (const step of commands) {
        const p = phones[step.phone]!
        const mine = visible(await p.local.instruments.toArray())
        if (step.kind === 'create') {
          await saveRecord(p.local, 'instrument', { teamId, userId: p.account.id, data: { label: step.label, readingKind: 'tds', resolution: 0.01, repeatability: 0.02 } })
        }
        else if (step.kind === 'edit' && mine.length) {
          await saveRecord(p.local, 'instrument', { teamId, userId: p.account.id, id: mine[step.pick % mine.length]!.id as string, data: { [step.field]: `${step.value} ${run}` } })
        }
        else if (step.kind === 'delete' && mine.length) {
          await deleteRecord(p.local, 'instrument', mine[step.pick % mine.length]!.id as string)
        }
        else if (step.kind === 'sync') {
          p.failNext(step.fault)
          await p.engine.syncNow()
        }
      }
      // Signal returns for good: every phone syncs until nothing is left to send, then once more to pull.
      for (let round = 0; round < 3; round++) {
        for (const p of phones)
          await p.engine.syncNow()
      }

      const server = (await request(app).get('/api/v1/sync/pull').query({ teamId, limit: 1000 }).set(...bearer(people[0]!))).body.changes as { id: string, rev: number, data: Record<string, unknown> }[]
      const onServer = new Map(server.map(change => [change.id, change]))
      // Exactly once: one row per record, one stored answer per delivered mutation.
      const [rows] = await database.db.select({ n: sql<number>`count(*)` }).from(records).where(eq(records.teamId, teamId))
      expect(Number(rows!.n)).toBe(onServer.size)
      const answers = await database.db.select({ clientId: syncMutations.clientId, mutationId: syncMutations.mutationId }).from(syncMutations)
      expect(new Set(answers.map(a => `${a.clientId}/${a.mutationId}`)).size).toBe(answers.length)

      for (const p of phones) {
        // Nothing waits to be sent: it went through, or it is set aside as refused for the person.
        const outbox = await p.local.outbox.toArray()
        expect(outbox.every(entry => entry.rejected)).toBe(true)
        for (const record of await p.local.instruments.toArray()) {
          const there = onServer.get(record.id)
          if (record.sync.state === 'clean') {
            // Converged: what the phone shows is what the server has.
            expect(there, `record ${record.id} on phone ${p.account.id}`).toBeDefined()
            expect({ label: record.label, notes: record.notes ?? '', deletedAt: Boolean(record.deletedAt), rev: record.rev })
              .toEqual({ label: there!.data.label, notes: there!.data.notes, deletedAt: Boolean(there!.data.deletedAt), rev: there!.rev })
          }
          else {
            // Refused or clashing changes stay on the phone, visible, with the reason or the server's copy.
            expect(['conflict', 'rejected']).toContain(record.sync.state)
            expect(record.sync.reason ?? record.sync.server).toBeTruthy()
          }
        }
        // Every record the server has reached every phone.
        for (const id of onServer.keys())
          expect(await p.local.instruments.get(id), `phone ${p.account.id} lacks ${id}`).toBeDefined()
      }
      // The viewer's own creations never reached the server, and are still on its phone, refused.
      const viewerRecords = (await phones[2]!.local.instruments.toArray()).filter(record => record.createdBy === people[2]!.id)
      for (const record of viewerRecords) {
        expect(onServer.has(record.id)).toBe(false)
        expect(record.sync.state).toBe('rejected')
      }
      const stale = await database.db.select().from(records).where(and(eq(records.teamId, teamId), eq(records.createdBy, people[2]!.id)))
      expect(stale).toEqual([])
      for (const p of phones)
        await p.local.delete()
    }), { numRuns: 40 })
  })
})
