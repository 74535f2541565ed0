import type { Express } from 'express'
import type { EntityName } from '../../shared/schemas/entities'
import type { Account } from '../server/auth-helpers'
import type { TestDatabase } from '../server/helpers'
import type { Fault, Phone } from './phones'
import { eq } from 'drizzle-orm'
import fc from 'fast-check'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { memberships, records, syncMutations } from '../../server/db/schema'
import { computeBrew } from '../../shared/brewing'
import { brewInputOf } from '../../shared/records/brew-input'
import { entityNames } from '../../shared/schemas/entities'
import { deleteRecord, fieldsOf, saveRecord } from '../../src/sync/outbox'
import { bearer, register } from '../server/auth-helpers'
import { buildTestApp, createTestDatabase } from '../server/helpers'
import { phone } from './phones'

// Three phones (the team's owner, a member, a viewer) with their own IndexedDB and the real sync
// engine, against the real server: instruments, brews with readings, event rounds and their
// sign-off, over dropped, lost and repeated deliveries and phones syncing at the same moment.

type Command
  = | { kind: 'instrument', phone: number, label: string }
    | { kind: 'rename', phone: number, pick: number, label: string }
    | { kind: 'brew', phone: number, values: number[], forCup: boolean }
    | { kind: 'reading', phone: number, pick: number, value: number }
    | { kind: 'delete', phone: number, pick: number, brew: boolean }
    | { kind: 'round', phone: number }
    | { kind: 'sign-off', phone: number, pick: number }
    | { kind: 'sync', phone: number, fault: Fault }
    | { kind: 'sync-all' }

const phoneIndex = fc.integer({ min: 0, max: 2 })
const word = fc.constantFrom('Bench', 'Harbour', 'Kiln', 'Ridge', 'Saltmarsh', 'Tern')
const tds = fc.integer({ min: 120, max: 145 }).map(n => n / 100)
const command: fc.Arbitrary<Command> = fc.oneof(
  fc.record({ kind: fc.constant('instrument' as const), phone: phoneIndex, label: word }),
  fc.record({ kind: fc.constant('rename' as const), phone: phoneIndex, pick: fc.nat(20), label: word }),
  { weight: 3, arbitrary: fc.record({ kind: fc.constant('brew' as const), phone: phoneIndex, values: fc.array(tds, { minLength: 1, maxLength: 3 }), forCup: fc.boolean() }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('reading' as const), phone: phoneIndex, pick: fc.nat(20), value: tds }) },
  fc.record({ kind: fc.constant('delete' as const), phone: phoneIndex, pick: fc.nat(20), brew: fc.boolean() }),
  fc.record({ kind: fc.constant('round' as const), phone: phoneIndex }),
  // Mostly the owner, who may sign off; the others are refused.
  fc.record({ kind: fc.constant('sign-off' as const), phone: fc.constantFrom(0, 0, 0, 1, 2), pick: fc.nat(5) }),
  { weight: 3, arbitrary: fc.record({ kind: fc.constant('sync' as const), phone: phoneIndex, fault: fc.constantFrom<Fault>('none', 'none', 'drop-request', 'drop-response', 'duplicate') }) },
  fc.constant({ kind: 'sync-all' as const }),
)

let database: TestDatabase
let app: Express
let people: Account[]
let run = 0

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
  people = [await register(app, 'owner'), await register(app, 'member'), await register(app, 'viewer')]
})
afterAll(async () => {
  await database.drop()
})

const now = (): string => new Date().toISOString()
const alive = <T extends { deletedAt: string | null }>(rows: T[]): T[] => rows.filter(row => !row.deletedAt)

async function step(p: Phone, step: Command, teamId: string): Promise<void> {
  const userId = p.account.id
  if (step.kind === 'instrument') {
    await saveRecord(p.local, 'instrument', { teamId, userId, data: { label: step.label, readingKind: 'tds', resolution: 0.01, repeatability: 0.02 } })
  }
  else if (step.kind === 'rename') {
    const mine = alive(await p.local.instruments.toArray())
    if (mine.length)
      await saveRecord(p.local, 'instrument', { teamId, userId, id: mine[step.pick % mine.length]!.id, data: { label: `${step.label} ${run}` } })
  }
  else if (step.kind === 'brew') {
    const cups = alive(await p.local.entries.toArray())
    const cup = step.forCup ? cups[step.values.length % Math.max(1, cups.length)] : undefined
    const brewId = await saveRecord(p.local, 'brew', { teamId, userId, data: { context: cup ? { kind: 'entry', refId: cup.id } : { kind: 'quick', refId: null }, method: 'percolation', strengthSource: 'direct', dose: 15, beverageMass: 240, brewedAt: now() } })
    for (const value of step.values)
      await saveRecord(p.local, 'reading', { teamId, userId, data: { brewId, value, kind: 'tds', takenAt: now() } })
  }
  else if (step.kind === 'reading') {
    const brews = alive(await p.local.brews.toArray())
    const brew = brews[step.pick % Math.max(1, brews.length)]
    // A teammate's brew is corrected with a reason, as the edit screen asks.
    if (brew)
      await saveRecord(p.local, 'reading', { teamId, userId, data: { brewId: brew.id, value: step.value, kind: 'tds', takenAt: now() }, reason: brew.createdBy === userId ? undefined : 'read again' })
  }
  else if (step.kind === 'delete') {
    const rows = alive<{ id: string, createdBy: string, deletedAt: string | null }>(step.brew ? await p.local.brews.toArray() : await p.local.instruments.toArray())
    const row = rows[step.pick % Math.max(1, rows.length)]
    if (row)
      await deleteRecord(p.local, step.brew ? 'brew' : 'instrument', row.id, { reason: row.createdBy === userId ? undefined : 'duplicate' })
  }
  else if (step.kind === 'round') {
    const eventId = await saveRecord(p.local, 'event', { teamId, userId, data: { name: `Open ${run}` } })
    const roundId = await saveRecord(p.local, 'round', { teamId, userId, data: { eventId, name: 'Heat', position: 1 } })
    await saveRecord(p.local, 'entry', { teamId, userId, data: { roundId, code: `K${run}` } })
  }
  else if (step.kind === 'sign-off') {
    const rounds = alive(await p.local.rounds.toArray()).filter(round => round.rev !== null)
    const round = rounds[step.pick % Math.max(1, rounds.length)]
    if (round) {
      const response = await request(app).post(`/api/v1/teams/${teamId}/rounds/${round.id}/sign-off`).set(...bearer(p.account))
      expect([200, 403]).toContain(response.status)
    }
  }
  else if (step.kind === 'sync') {
    p.failNext(step.fault)
    await p.engine.syncNow()
  }
}

describe('sync of three phones over faulty deliveries', () => {
  it('converges every phone on the server, applies each mutation once, derives every brew from all its readings and keeps signed-off rounds frozen', async () => {
    await fc.assert(fc.asyncProperty(fc.array(command, { minLength: 4, maxLength: 30 }), async (commands) => {
      run += 1
      const teamId = (await request(app).post('/api/v1/teams').set(...bearer(people[0]!)).send({ name: `Model crew ${run}` })).body.team.id as string
      await database.db.insert(memberships).values([{ teamId, userId: people[1]!.id, role: 'member' }, { teamId, userId: people[2]!.id, role: 'viewer' }])
      const phones = people.map((account, i) => phone(app, account, teamId, `model-${run}-${i}`))
      // The owner has set up a heat with two cups, and every phone has it.
      await step(phones[0]!, { kind: 'round', phone: 0 }, teamId)
      await step(phones[0]!, { kind: 'round', phone: 0 }, teamId)
      for (const p of phones)
        await p.engine.syncNow()

      for (const next of commands) {
        if (next.kind === 'sync-all')
          await Promise.all(phones.map(p => p.engine.syncNow()))
        else
          await step(phones[next.phone]!, next, teamId)
      }
      // Signal returns for good: every phone syncs until nothing is left to send, then once more to pull.
      for (let round = 0; round < 3; round++)
        await Promise.all(phones.map(p => p.engine.syncNow()))

      const server = (await database.db.select().from(records).where(eq(records.teamId, teamId)))
      const onServer = new Map(server.map(row => [row.id, row]))
      // Exactly once: one stored answer per delivered mutation, one row per record.
      const answers = await database.db.select({ clientId: syncMutations.clientId, mutationId: syncMutations.mutationId }).from(syncMutations)
      expect(new Set(answers.map(a => `${a.clientId}/${a.mutationId}`)).size).toBe(answers.length)

      for (const p of phones) {
        // Nothing waits to be sent: it went through, or it is set aside as refused for the person.
        expect((await p.local.outbox.toArray()).every(entry => entry.rejected)).toBe(true)
        for (const entity of entityNames) {
          for (const record of await p.local.records[entity].toArray()) {
            const there = onServer.get(record.id)
            if (record.sync.state === 'clean') {
              // Converged: what the phone shows is what the server has.
              expect(there, `${entity} ${record.id} on phone ${p.account.id}`).toBeDefined()
              expect({ ...fieldsOf(record), deletedAt: Boolean(record.deletedAt), rev: record.rev }).toEqual({ ...there!.data, deletedAt: Boolean(there!.deletedAt), rev: there!.rev })
            }
            else {
              // Refused or clashing changes stay on the phone, visible, with the reason or the server's copy.
              expect(['conflict', 'rejected']).toContain(record.sync.state)
              expect(record.sync.reason ?? record.sync.server).toBeTruthy()
            }
          }
        }
        // Every record the server has reached every phone.
        for (const [id, row] of onServer)
          expect(await p.local.records[row.entity as EntityName].get(id), `phone ${p.account.id} lacks ${row.entity} ${id}`).toBeDefined()
      }
      // The viewer's own creations never reached the server.
      expect(server.filter(row => row.createdBy === people[2]!.id)).toEqual([])

      // Every brew's result is the core's, from all its readings on the server.
      for (const brew of server.filter(row => row.entity === 'brew')) {
        const readings = server.filter(row => row.entity === 'reading' && row.parentId === brew.id && !row.deletedAt).map(row => ({ id: row.id, value: Number(row.data.value) }))
        const expected = computeBrew(brewInputOf(brew.data as never, readings, null))
        expect((brew.derived as { tdsPercent: number | null }).tdsPercent).toBe(expected.tdsPercent)
      }
      // Nothing inside a signed-off round changed after its sign-off.
      for (const round of server.filter(row => row.entity === 'round' && row.derived)) {
        const cups = server.filter(row => row.entity === 'entry' && row.parentId === round.id)
        const brews = server.filter(row => row.entity === 'brew' && cups.some(cup => cup.id === row.parentId))
        const readings = server.filter(row => row.entity === 'reading' && brews.some(brew => brew.id === row.parentId))
        for (const row of [...cups, ...brews, ...readings])
          expect(row.rev, `${row.entity} ${row.id} after sign-off`).toBeLessThan(round.rev)
      }
      for (const p of phones)
        await p.local.delete()
    }), { numRuns: 60 })
  })
})
