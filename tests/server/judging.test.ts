import type { Express } from 'express'
import type { Role } from '../../shared/schemas/auth'
import type { Account } from './auth-helpers'
import type { TestDatabase } from './helpers'
import { and, eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { auditLog, memberships, records } from '../../server/db/schema'
import { frozenMessage } from '../../shared/records/rules'
import { bearer, register } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'
import { pourOver, pull, push, put, reading, remove } from './sync-helpers'

let database: TestDatabase
let app: Express
let teamId: string
const crew = {} as Record<Role, Account>

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
  crew.owner = await register(app, 'Owner')
  teamId = (await request(app).post('/api/v1/teams').set(...bearer(crew.owner)).send({ name: 'Saltmarsh Judges' })).body.team.id
  for (const role of ['lead', 'member', 'viewer'] as const) {
    crew[role] = await register(app, role)
    await database.db.insert(memberships).values({ teamId, userId: crew[role].id, role })
  }
})
afterAll(async () => {
  await database.drop()
})

const checklist = { cupsMeasured: true, flaggedSeen: true, conflictsSettled: true, zeroChecked: true }

/** An event with one round and two cups, set up by the lead, and a member's pour of the first cup. */
async function heat(name = 'Gull Point Brewers Open') {
  const event = put('event', teamId, { name })
  const round = put('round', teamId, { eventId: event.id, name: 'Heat 1', position: 1 })
  const cups = [put('entry', teamId, { roundId: round.id, code: 'KX4M', contestant: 'Wren Addersley' }), put('entry', teamId, { roundId: round.id, code: 'T9PH', contestant: 'Oona Brackwater' })]
  const results = (await push(app, crew.lead, [event, round, ...cups])).body.results
  expect(results.map((r: { status: string }) => r.status)).toEqual(['applied', 'applied', 'applied', 'applied'])
  const pour = put('brew', teamId, pourOver({ context: { kind: 'entry', refId: cups[0]!.id } }))
  await push(app, crew.member, [pour, put('reading', teamId, reading(pour.id, 1.38))])
  return { event, round, cups, pour, revs: Object.fromEntries([event, round, ...cups].map((m, i) => [m.id, results[i].rev as number])) }
}

const entriesIn = (changes: { entity: string, id: string, data: Record<string, unknown> }[], ids: string[]) => changes.filter(change => ids.includes(change.id))

describe('blind judging', () => {
  it('leaves the competitor out of what members and viewers pull until the round is signed off', async () => {
    const { round, cups } = await heat()
    const ids = cups.map(cup => cup.id)
    for (const role of ['member', 'viewer'] as const) {
      const sent = entriesIn((await pull(app, crew[role], teamId)).body.changes, ids)
      expect(sent).toHaveLength(2)
      expect(sent.every(change => !('contestant' in change.data))).toBe(true)
      expect(JSON.stringify(sent)).not.toContain('Addersley')
    }
    expect(entriesIn((await pull(app, crew.lead, teamId)).body.changes, ids).map(change => change.data.contestant)).toEqual(['Wren Addersley', 'Oona Brackwater'])

    const before = (await pull(app, crew.member, teamId)).body.cursor
    await request(app).post(`/api/v1/teams/${teamId}/rounds/${round.id}/sign-off`).set(...bearer(crew.lead)).expect(200)
    // The cups come again after the sign-off, names and all, so the member's phone learns them.
    const after = entriesIn((await pull(app, crew.member, teamId, before)).body.changes, ids)
    expect(after.map(change => change.data.contestant)).toEqual(['Wren Addersley', 'Oona Brackwater'])
  })

  it('leaves a renamed competitor out of the history a member reads, on the record and in the full history', async () => {
    const { cups, revs } = await heat('Tern Quay Open')
    const renamed = put('entry', teamId, { contestant: 'Wren Addersley-Holt', notes: 'late entry' }, { id: cups[0]!.id, baseRev: revs[cups[0]!.id] })
    expect((await push(app, crew.lead, [renamed])).body.results[0].status).toBe('applied')
    const record = entriesIn((await pull(app, crew.member, teamId)).body.changes, [cups[0]!.id])[0]!
    expect(record.data.history).toEqual([expect.objectContaining({ changes: { notes: { from: '', to: 'late entry' } } })])
    const full = await request(app).get(`/api/v1/teams/${teamId}/records/${cups[0]!.id}/history`).set(...bearer(crew.member))
    expect(JSON.stringify(full.body)).not.toContain('Addersley')
    expect(full.body.history[0].changes).toEqual({ notes: { from: '', to: 'late entry' } })
    const lead = await request(app).get(`/api/v1/teams/${teamId}/records/${cups[0]!.id}/history`).set(...bearer(crew.lead))
    expect(lead.body.history[0].changes.contestant).toEqual({ from: 'Wren Addersley', to: 'Wren Addersley-Holt' })
  })

  it('leaves it out of the server\'s copy in a conflict answer, and out of the same answer given again', async () => {
    const { cups, revs } = await heat('Heron Steps Open')
    const cup = cups[1]!
    await push(app, crew.lead, [remove('entry', teamId, cup.id, revs[cup.id]!)])
    // A put to a deleted record is answered with the server's copy, before any other rule.
    const late = put('entry', teamId, { notes: 'wobbly table' }, { id: cup.id, baseRev: revs[cup.id] })
    for (let delivery = 0; delivery < 2; delivery++) {
      const [answer] = (await push(app, crew.member, [late], '0190a0f0-0000-7000-8000-00000000c0ff')).body.results
      expect(answer).toMatchObject({ status: 'conflict', server: expect.objectContaining({ code: 'T9PH' }) })
      expect(answer.server).not.toHaveProperty('contestant')
    }
  })

  it('keeps blind codes unique in the event, across its rounds, but not across events', async () => {
    const { event } = await heat('Sandpiper Open')
    const second = put('round', teamId, { eventId: event.id, name: 'Heat 2', position: 2 })
    const again = put('entry', teamId, { roundId: second.id, code: 'kx4m' })
    const [, clash] = (await push(app, crew.lead, [second, again])).body.results
    expect(clash).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/^code: another cup of this event already has the code kx4m/) })
    const elsewhere = await heat('Plover Cup')
    expect(elsewhere.cups[0]!.data.code).toBe('KX4M')
  })

  it('lets only a lead or an owner set up events, rounds and cups', async () => {
    const event = put('event', teamId, { name: 'Member-made Open' })
    expect((await push(app, crew.member, [event])).body.results[0]).toMatchObject({ status: 'rejected', reason: 'Only a lead or an owner can set up or change events.' })
  })
})

describe('a sign-off queued on a phone', () => {
  it('freezes the round as the route does: stamped, cups sent again, history and audit', async () => {
    const { round, cups, revs } = await heat('Curlew Open')
    const signoff = put('signoff', teamId, { roundId: round.id, checklist, seenEntryIds: [cups[0]!.id], note: '' })
    const [answer] = (await push(app, crew.lead, [signoff])).body.results
    expect(answer.status).toBe('applied')
    const [row] = await database.db.select().from(records).where(eq(records.id, round.id))
    expect(row!.derived).toEqual({ signedOffAt: expect.any(String), signedOffBy: crew.lead.id })
    expect(row!.history!.at(-1)!.changes).toHaveProperty('signedOffAt')
    const cupRows = await database.db.select().from(records).where(eq(records.parentId, round.id))
    for (const cup of cupRows.filter(r => r.entity === 'entry')) {
      expect(cup.rev).toBeGreaterThan(revs[cup.id]!)
      expect(cup.rev).toBeLessThan(row!.rev)
    }
    expect(cupRows.find(r => r.entity === 'signoff')?.rev).toBe(answer.rev)
    const logged = await database.db.select().from(auditLog).where(and(eq(auditLog.subjectId, round.id), eq(auditLog.action, 'round.signed_off')))
    expect(logged).toHaveLength(1)
    expect(logged[0]!.detail).toEqual({ via: 'phone', cups: 2 })
  })

  it('is answered applied for a round already signed off, and changes nothing', async () => {
    const { round } = await heat('Dunlin Open')
    await request(app).post(`/api/v1/teams/${teamId}/rounds/${round.id}/sign-off`).set(...bearer(crew.owner)).expect(200)
    const [before] = await database.db.select().from(records).where(eq(records.id, round.id))
    const late = put('signoff', teamId, { roundId: round.id, checklist, note: '' })
    expect((await push(app, crew.lead, [late])).body.results[0]).toEqual({ mutationId: late.mutationId, status: 'applied', rev: before!.rev })
    const [after] = await database.db.select().from(records).where(eq(records.id, round.id))
    expect(after).toEqual(before)
    expect(await database.db.select().from(records).where(eq(records.id, late.id))).toEqual([])
  })

  it('works out the pours sent before it in the same push first, so nothing of the round comes after it', async () => {
    const { round, cups } = await heat('Godwit Open')
    const pour = put('brew', teamId, pourOver({ context: { kind: 'entry', refId: cups[1]!.id } }))
    const signoff = put('signoff', teamId, { roundId: round.id, checklist, note: '' })
    const results = (await push(app, crew.lead, [pour, put('reading', teamId, reading(pour.id, 1.31)), signoff])).body.results
    expect(results.map((r: { status: string }) => r.status)).toEqual(['applied', 'applied', 'applied'])
    const [brew] = await database.db.select().from(records).where(eq(records.id, pour.id))
    const [frozen] = await database.db.select().from(records).where(eq(records.id, round.id))
    expect((brew!.derived as { tdsPercent: number }).tdsPercent).toBeCloseTo(1.31, 10)
    expect(brew!.rev).toBeLessThan(frozen!.rev)
  })

  it('refuses a change to a cup made on another phone after it, with the frozen reason', async () => {
    const { round, pour } = await heat('Knot Open')
    await push(app, crew.lead, [put('signoff', teamId, { roundId: round.id, checklist, note: '' })])
    const [late] = (await push(app, crew.member, [put('reading', teamId, reading(pour.id, 1.4))])).body.results
    expect(late).toMatchObject({ status: 'rejected', reason: frozenMessage })
  })

  it('needs a note when an item of the check list is left open, and a lead or owner to send it', async () => {
    const { round } = await heat('Ruff Open')
    const open = put('signoff', teamId, { roundId: round.id, checklist: { ...checklist, zeroChecked: false } })
    expect((await push(app, crew.lead, [open])).body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/^note: say why/) })
    const byMember = put('signoff', teamId, { roundId: round.id, checklist, note: '' })
    expect((await push(app, crew.member, [byMember])).body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringContaining('Only a lead or an owner') })
    const [row] = await database.db.select().from(records).where(eq(records.id, round.id))
    expect(row!.derived).toBeNull()
  })
})

describe('zero checks', () => {
  it('are append-only records bounded by the instrument\'s unit', async () => {
    const gauge = put('instrument', teamId, { label: 'Brew bar pen', readingKind: 'tds', resolution: 0.01, repeatability: 0.02 })
    const check = put('zeroCheck', teamId, { instrumentId: gauge.id, kind: 'tds', reading: 0.01, checkedAt: '2026-05-01T08:00:00.000+02:00' })
    const silly = put('zeroCheck', teamId, { instrumentId: gauge.id, kind: 'tds', reading: 42, checkedAt: '2026-05-01T08:00:00.000+02:00' })
    const results = (await push(app, crew.member, [gauge, check, silly])).body.results
    expect(results.map((r: { status: string }) => r.status)).toEqual(['applied', 'applied', 'rejected'])
    expect(results[2].reason).toMatch(/^reading: must be a reading from/)
    const edit = put('zeroCheck', teamId, { reading: 0 }, { id: check.id, baseRev: results[1].rev })
    expect((await push(app, crew.member, [edit])).body.results[0].reason).toContain('cannot be changed once recorded')
  })
})
