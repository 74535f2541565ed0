import type { Express } from 'express'
import type { Role } from '../../shared/schemas/auth'
import type { Account } from './auth-helpers'
import type { TestDatabase } from './helpers'
import { eq, sql } from 'drizzle-orm'
import request from 'supertest'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { memberships, records, teamSyncState } from '../../server/db/schema'
import { bearer, register } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'
import { instrument, now, pourOver, pull, push, put, reading, remove } from './sync-helpers'

let database: TestDatabase
let app: Express
let teamId: string
const crew = {} as Record<Role | 'outsider', Account>

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
  crew.owner = await register(app, 'Owner')
  teamId = (await request(app).post('/api/v1/teams').set(...bearer(crew.owner)).send({ name: 'Harbour Cupping Lab' })).body.team.id
  for (const role of ['lead', 'member', 'viewer'] as const) {
    crew[role] = await register(app, role)
    await database.db.insert(memberships).values({ teamId, userId: crew[role].id, role })
  }
  crew.outsider = await register(app, 'Outsider')
})
afterAll(async () => {
  await database.drop()
})

describe('POST /api/v1/sync/push', () => {
  it('applies a new record with a server rev and lets the team pull it', async () => {
    const mutation = put('instrument', teamId, instrument('Bench A'))
    const response = await push(app, crew.member, [mutation])
    expect(response.status).toBe(200)
    expect(response.body.results).toEqual([{ mutationId: mutation.mutationId, status: 'applied', rev: expect.any(Number) }])
    const changes = (await pull(app, crew.viewer, teamId)).body.changes
    expect(changes).toContainEqual(expect.objectContaining({ entity: 'instrument', id: mutation.id, op: 'put', data: expect.objectContaining({ label: 'Bench A', createdBy: crew.member.id }) }))
  })

  it('answers a batch delivered twice with the first results and applies it once', async () => {
    const clientId = uuidv7()
    const batch = [put('instrument', teamId, instrument('Twice')), put('recipe', teamId, { name: 'House filter', method: 'percolation', dose: 15, waterMass: 250 })]
    const first = await push(app, crew.member, batch, clientId)
    const [before] = await database.db.select().from(teamSyncState).where(eq(teamSyncState.teamId, teamId))
    const second = await push(app, crew.member, batch, clientId)
    const [after] = await database.db.select().from(teamSyncState).where(eq(teamSyncState.teamId, teamId))
    expect(second.body).toEqual(first.body)
    expect(after!.lastRev).toBe(before!.lastRev)
  })

  it('merges edits of different fields and reports a conflict on the same field', async () => {
    const brew = put('brew', teamId, pourOver({ notes: 'first pour', grindSetting: '22' }))
    const created = (await push(app, crew.lead, [brew])).body.results[0]
    // A second phone corrects the notes...
    const notes = put('brew', teamId, { notes: 'bloom 40 s' }, { id: brew.id, baseRev: created.rev, reason: 'The bloom time was left out' })
    expect((await push(app, crew.owner, [notes])).body.results[0].status).toBe('applied')
    // ...while the first, from the same base, changes the grind (merges) and the notes (clashes).
    const grind = put('brew', teamId, { grindSetting: '24' }, { id: brew.id, baseRev: created.rev })
    const clash = put('brew', teamId, { notes: 'my own note' }, { id: brew.id, baseRev: created.rev })
    const [merged, conflict] = (await push(app, crew.lead, [grind, clash])).body.results
    expect(merged.status).toBe('applied')
    expect(conflict).toMatchObject({ status: 'conflict', server: expect.objectContaining({ notes: 'bloom 40 s', grindSetting: '24' }) })
  })

  it('rejects a malformed mutation on its own and applies the rest of the batch', async () => {
    const good = put('instrument', teamId, instrument('Still applied'))
    const results = (await push(app, crew.member, [{ mutationId: uuidv7(), entity: 'teapot', op: 'put' }, put('instrument', teamId, { label: '' }), good])).body.results
    expect(results.map((r: { status: string }) => r.status)).toEqual(['rejected', 'rejected', 'applied'])
    expect(results[1].reason).toMatch(/^label: /)
  })

  it('never takes derived values from a phone, and computes them itself', async () => {
    const cheat = put('brew', teamId, pourOver({ tdsPercent: 1.5 }))
    expect((await push(app, crew.member, [cheat])).body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringContaining('tdsPercent') })

    // 15 g dose, 652.6 − 412.6 = 240.0 g beverage, readings 1.34, 1.35, 1.36 %TDS → 1.35 %, EY 21.6 %
    // (the handbook's worked pour-over example).
    const brew = put('brew', teamId, pourOver())
    await push(app, crew.member, [brew, put('reading', teamId, reading(brew.id, 1.34)), put('reading', teamId, reading(brew.id, 1.35)), put('reading', teamId, reading(brew.id, 1.36))])
    const [row] = await database.db.select().from(records).where(eq(records.id, brew.id))
    expect(row!.derived!.tdsPercent).toBeCloseTo(1.35, 10)
    expect(row!.derived!.yieldPercent).toBeCloseTo(21.6, 10)
  })

  it('recomputes a brew when a later reading arrives, as a new rev', async () => {
    const brew = put('brew', teamId, pourOver())
    const first = (await push(app, crew.member, [brew, put('reading', teamId, reading(brew.id, 1.3))])).body.results[0]
    const later = await push(app, crew.member, [put('reading', teamId, reading(brew.id, 1.4))])
    const [row] = await database.db.select().from(records).where(eq(records.id, brew.id))
    expect(row!.rev).toBeGreaterThan(first.rev)
    expect(row!.rev).toBeGreaterThan(later.body.results[0].rev)
    expect(row!.derived!.tdsPercent).toBeCloseTo(1.35, 10)
  })

  it('fits a calibration on the server', async () => {
    const gauge = put('instrument', teamId, { ...instrument('Sugar gauge'), readingKind: 'nD', resolution: 0.00001, repeatability: 0.00002 })
    // Sucrose standards read at the ICUMSA table's nD (0, 5, 10, 15 °Brix).
    const points = [[0, 1.33299], [5, 1.34026], [10, 1.34782], [15, 1.35568]].map(([concentration, reading]) => ({ concentration, reading }))
    const calibration = put('calibration', teamId, { instrumentId: gauge.id, standardUnit: 'brix', points, active: true, calibratedAt: now() })
    await push(app, crew.lead, [gauge, calibration])
    const record = (await pull(app, crew.lead, teamId)).body.changes.find((c: { id: string }) => c.id === calibration.id)
    expect(record.data.derived.fit.slope).toBeCloseTo(0.0015127, 6)
    expect(record.data.derived.fit.rSquared).toBeGreaterThan(0.999)
  })

  it('keeps readings as recorded: no edits, no deletes', async () => {
    const brew = put('brew', teamId, pourOver())
    const first = put('reading', teamId, reading(brew.id, 1.31))
    const applied = (await push(app, crew.member, [brew, first])).body.results[1]
    const edit = put('reading', teamId, { value: 1.39 }, { id: first.id, baseRev: applied.rev })
    const drop = remove('reading', teamId, first.id, applied.rev)
    const results = (await push(app, crew.member, [edit, drop])).body.results
    expect(results.map((r: { status: string }) => r.status)).toEqual(['rejected', 'rejected'])
  })

  it('rejects a reading for a brew the server does not have', async () => {
    const orphan = put('reading', teamId, reading(uuidv7(), 1.3))
    expect((await push(app, crew.member, [orphan])).body.results[0]).toMatchObject({ status: 'rejected', reason: 'The brew this record belongs to is not on the server.' })
  })

  it('checks roles: viewers push nothing, members change only their own records', async () => {
    expect((await push(app, crew.viewer, [put('instrument', teamId, instrument())])).body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringContaining('Viewers') })
    const leads = put('instrument', teamId, instrument('Lead\'s'))
    const rev = (await push(app, crew.lead, [leads])).body.results[0].rev
    const edit = put('instrument', teamId, { label: 'Renamed by a member' }, { id: leads.id, baseRev: rev })
    expect((await push(app, crew.member, [edit])).body.results[0].status).toBe('rejected')
    expect((await push(app, crew.owner, [{ ...edit, mutationId: uuidv7() }])).body.results[0].status).toBe('applied')
  })

  it('refuses a mutation for a team the user is not in on its own, and answers 401 without a session', async () => {
    const foreign = put('instrument', teamId, instrument())
    const response = await push(app, crew.outsider, [foreign])
    expect(response.status).toBe(200)
    expect(response.body.results).toEqual([{ mutationId: foreign.mutationId, status: 'rejected', reason: expect.stringMatching(/^teamId: you are not in this team/) }])
    expect((await request(app).post('/api/v1/sync/push').send({ clientId: uuidv7(), mutations: [] })).status).toBe(401)
  })

  it('answers 413 for a batch over the limit', async () => {
    const many = Array.from({ length: 201 }, () => put('instrument', teamId, instrument()))
    const response = await push(app, crew.member, many)
    expect(response.status).toBe(413)
    expect(response.body.error.code).toBe('batch_too_large')
  })

  it('refuses changes inside a signed-off round, with the reason', async () => {
    const event = put('event', teamId, { name: 'Saltmarsh Filter Open' })
    const round = put('round', teamId, { eventId: event.id, name: 'Heat 1', position: 1 })
    const entry = put('entry', teamId, { roundId: round.id, code: 'K7' })
    const brew = put('brew', teamId, pourOver({ context: { kind: 'entry', refId: entry.id } }))
    await push(app, crew.lead, [event, round, entry])
    await push(app, crew.member, [brew])
    expect((await request(app).post(`/api/v1/teams/${teamId}/rounds/${round.id}/sign-off`).set(...bearer(crew.member))).status).toBe(403)
    const signed = await request(app).post(`/api/v1/teams/${teamId}/rounds/${round.id}/sign-off`).set(...bearer(crew.lead))
    expect(signed.body.round.derived).toEqual({ signedOffAt: expect.any(String), signedOffBy: crew.lead.id })
    const late = put('reading', teamId, reading(brew.id, 1.3))
    expect((await push(app, crew.member, [late])).body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringContaining('signed off') })
  })
})

describe('GET /api/v1/sync/pull', () => {
  it('pages through changes in rev order with a cursor', async () => {
    const team = (await request(app).post('/api/v1/teams').set(...bearer(crew.owner)).send({ name: 'Paging Crew' })).body.team.id
    await push(app, crew.owner, Array.from({ length: 7 }, (_, i) => put('instrument', team, instrument(`Gauge ${i}`))))
    const pages: number[][] = []
    const remaining: number[] = []
    let since = 0
    for (let more = true; more;) {
      const body = (await pull(app, crew.owner, team, since, 3)).body
      pages.push(body.changes.map((c: { rev: number }) => c.rev))
      remaining.push(body.remaining)
      since = body.cursor
      more = body.hasMore
    }
    expect(pages).toEqual([[1, 2, 3], [4, 5, 6], [7]])
    // What is left after each page, for the phone's "n of m".
    expect(remaining).toEqual([4, 1, 0])
  })

  it('carries tombstones', async () => {
    const gauge = put('instrument', teamId, instrument('Retired'))
    const rev = (await push(app, crew.member, [gauge])).body.results[0].rev
    await push(app, crew.member, [remove('instrument', teamId, gauge.id, rev)])
    const change = (await pull(app, crew.viewer, teamId, rev)).body.changes.find((c: { id: string }) => c.id === gauge.id)
    expect(change).toMatchObject({ op: 'delete', data: expect.objectContaining({ deletedAt: expect.any(String) }) })
  })

  it('lets a viewer pull, and no one outside the team', async () => {
    expect((await pull(app, crew.viewer, teamId)).status).toBe(200)
    expect((await pull(app, crew.outsider, teamId)).status).toBe(404)
  })
})

describe('revs commit in order', () => {
  it('never lets a pull skip a change that commits late', async () => {
    // The first push takes its revs and then waits before committing; a second push starts meanwhile.
    let release!: () => void
    const held = new Promise<void>(resolve => (release = resolve))
    let holds = 1
    const slowApp = buildTestApp(database, { syncHooks: { beforeCommit: async () => {
      if (holds-- > 0)
        await held
    } } })
    const team = (await request(app).post('/api/v1/teams').set(...bearer(crew.owner)).send({ name: 'Race Crew' })).body.team.id
    const slow = push(slowApp, crew.owner, [put('instrument', team, instrument('Slow'))])
    await new Promise(resolve => setTimeout(resolve, 200))
    const fast = push(slowApp, crew.owner, [put('instrument', team, instrument('Fast'))])
    await new Promise(resolve => setTimeout(resolve, 200))
    // A phone pulls while the slow push is still open: with plain auto-increment it would see the
    // fast one's later rev and move its cursor past the slow one's.
    const during = (await pull(app, crew.owner, team)).body
    expect(during.changes).toEqual([])
    release()
    const [slowResult, fastResult] = await Promise.all([slow, fast])
    expect(slowResult.body.results[0].rev).toBeLessThan(fastResult.body.results[0].rev)
    const after = (await pull(app, crew.owner, team, during.cursor)).body
    expect(after.changes.map((c: { data: { label: string } }) => c.data.label)).toEqual(['Slow', 'Fast'])
    const [count] = await database.db.select({ n: sql<number>`count(*)` }).from(teamSyncState).where(eq(teamSyncState.teamId, team))
    expect(Number(count!.n)).toBe(1)
  })
})
