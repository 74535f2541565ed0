import type { Express } from 'express'
import type { Role } from '../../shared/schemas/auth'
import type { Account } from './auth-helpers'
import type { TestDatabase } from './helpers'
import { eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { memberships, records } from '../../server/db/schema'
import { bearer, register } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'
import { pourOver, pull, push, put, reading, remove, restore } from './sync-helpers'

let database: TestDatabase
let app: Express
let teamId: string
const crew = {} as Record<Exclude<Role, 'viewer'>, Account>

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
  crew.owner = await register(app, 'Owner')
  teamId = (await request(app).post('/api/v1/teams').set(...bearer(crew.owner)).send({ name: 'Gullwing Roastery Crew' })).body.team.id
  crew.lead = await register(app, 'Lead')
  crew.member = await register(app, 'Member')
  await database.db.insert(memberships).values([{ teamId, userId: crew.lead.id, role: 'lead' }, { teamId, userId: crew.member.id, role: 'member' }])
})
afterAll(async () => {
  await database.drop()
})

async function stored(id: string) {
  const [row] = await database.db.select().from(records).where(eq(records.id, id))
  return row!
}

/** A member's pour-over with three readings: 1.35 %TDS, 21.6 % EY (the handbook's worked example). */
async function measured() {
  const brew = put('brew', teamId, pourOver({ notes: 'first cup' }))
  const readings = [1.34, 1.35, 1.36].map(value => put('reading', teamId, reading(brew.id, value)))
  await push(app, crew.member, [brew, ...readings])
  return { brew, readings, rev: (await stored(brew.id)).rev }
}

describe('the history of a record', () => {
  it('starts empty and records each edit with the fields before and after, who and when', async () => {
    const { brew, rev } = await measured()
    expect((await stored(brew.id)).history).toBeNull()
    const edit = put('brew', teamId, { notes: 'bloom 40 s', grindSetting: '22' }, { id: brew.id, baseRev: rev })
    const applied = (await push(app, crew.member, [edit])).body.results[0]
    const history = (await stored(brew.id)).history!
    expect(history).toEqual([{ rev: applied.rev, at: expect.any(String), by: crew.member.id, op: 'edit', changes: { notes: { from: 'first cup', to: 'bloom 40 s' }, grindSetting: { from: '', to: '22' } } }])
    const change = (await pull(app, crew.lead, teamId)).body.changes.find((c: { id: string }) => c.id === brew.id)
    expect(change.data.history).toEqual(history)
  })

  it('shows how the result moved when an edit changes it', async () => {
    const { brew, rev } = await measured()
    // Dose 15 → 16 g: EY = 1.35 × 240 / 16 = 20.25 %.
    await push(app, crew.member, [put('brew', teamId, { dose: 16 }, { id: brew.id, baseRev: rev })])
    const row = await stored(brew.id)
    expect(row.history).toHaveLength(1)
    const { result, dose } = row.history![0]!.changes
    expect(dose).toEqual({ from: 15, to: 16 })
    expect((result!.from as { yieldPercent: number }).yieldPercent).toBeCloseTo(21.6, 10)
    expect((result!.to as { yieldPercent: number }).yieldPercent).toBeCloseTo(20.25, 10)
  })

  it('counts readings that come after the brew was stored', async () => {
    const { brew } = await measured()
    await push(app, crew.member, [put('reading', teamId, reading(brew.id, 1.39))])
    const entry = (await stored(brew.id)).history!.at(-1)!
    expect(entry.changes.readings).toEqual({ from: 3, to: 4 })
    expect((entry.changes.result!.to as { tdsPercent: number }).tdsPercent).toBeCloseTo(1.36, 10)
  })

  it('leaves set-aside readings out of the result and keeps them on record', async () => {
    const { brew, readings, rev } = await measured()
    const outlier = put('reading', teamId, reading(brew.id, 1.52))
    await push(app, crew.member, [outlier])
    expect((await stored(brew.id)).derived!.tdsPercent).toBeCloseTo(1.3925, 10)
    const current = (await stored(brew.id)).rev
    await push(app, crew.member, [put('brew', teamId, { excludedReadingIds: [outlier.id] }, { id: brew.id, baseRev: current })])
    const row = await stored(brew.id)
    expect(row.derived!.tdsPercent).toBeCloseTo(1.35, 10)
    expect(row.history!.at(-1)!.changes.excludedReadingIds).toEqual({ from: [], to: [outlier.id] })
    expect(rev).toBeLessThan(row.rev)
    const pulled = (await pull(app, crew.member, teamId)).body.changes.filter((c: { entity: string, data: { brewId?: string } }) => c.entity === 'reading' && c.data.brewId === brew.id)
    expect(pulled.map((c: { id: string }) => c.id).sort()).toEqual([...readings.map(r => r.id), outlier.id].sort())
  })
})

describe('corrections of a teammate\'s brew', () => {
  it('are refused without a reason, naming the field', async () => {
    const { brew, rev } = await measured()
    const result = (await push(app, crew.lead, [put('brew', teamId, { dose: 15.5 }, { id: brew.id, baseRev: rev })])).body.results[0]
    expect(result).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/^reason: /) })
    expect((await push(app, crew.lead, [remove('brew', teamId, brew.id, rev)])).body.results[0].status).toBe('rejected')
  })

  it('are applied with a reason, which the history keeps', async () => {
    const { brew, rev } = await measured()
    const reason = 'The dose was read off the wrong scale'
    const result = (await push(app, crew.lead, [put('brew', teamId, { dose: 15.5 }, { id: brew.id, baseRev: rev, reason })])).body.results[0]
    expect(result.status).toBe('applied')
    expect((await stored(brew.id)).history!.at(-1)).toMatchObject({ by: crew.lead.id, reason, changes: { dose: { from: 15, to: 15.5 } } })
  })

  it('need no reason from the person who recorded the brew', async () => {
    const { brew, rev } = await measured()
    expect((await push(app, crew.member, [put('brew', teamId, { notes: 'mine' }, { id: brew.id, baseRev: rev })])).body.results[0].status).toBe('applied')
  })
})

describe('delete and restore', () => {
  it('brings a deleted brew back as a new rev, with both steps in its history', async () => {
    const { brew, rev } = await measured()
    const deleted = (await push(app, crew.member, [remove('brew', teamId, brew.id, rev)])).body.results[0]
    expect((await stored(brew.id)).deletedAt).not.toBeNull()
    const restored = (await push(app, crew.member, [restore('brew', teamId, brew.id, deleted.rev)])).body.results[0]
    expect(restored.status).toBe('applied')
    expect(restored.rev).toBeGreaterThan(deleted.rev)
    const row = await stored(brew.id)
    expect(row.deletedAt).toBeNull()
    expect(row.history!.map((entry: { op: string }) => entry.op)).toEqual(['delete', 'restore'])
    const change = (await pull(app, crew.owner, teamId, deleted.rev)).body.changes.find((c: { id: string }) => c.id === brew.id)
    expect(change).toMatchObject({ op: 'put', rev: restored.rev, data: expect.objectContaining({ deletedAt: null }) })
  })

  it('answers a restore of a record that is not deleted without a new rev', async () => {
    const { brew, rev } = await measured()
    expect((await push(app, crew.member, [restore('brew', teamId, brew.id, rev)])).body.results[0]).toMatchObject({ status: 'applied', rev })
  })

  it('refuses a restore from a member who did not make the record', async () => {
    const { brew, rev } = await measured()
    const deleted = (await push(app, crew.member, [remove('brew', teamId, brew.id, rev)])).body.results[0]
    const other = await register(app, 'other')
    await database.db.insert(memberships).values({ teamId, userId: other.id, role: 'member' })
    expect((await push(app, other, [restore('brew', teamId, brew.id, deleted.rev)])).body.results[0].status).toBe('rejected')
  })
})

describe('a team\'s own zones', () => {
  it('sync like any record', async () => {
    const zone = put('zone', teamId, { name: 'Harbour house filter', tdsPercent: { min: 1.25, max: 1.4 }, yieldPercent: { min: 19, max: 21.5 } })
    expect((await push(app, crew.member, [zone])).body.results[0].status).toBe('applied')
    const change = (await pull(app, crew.owner, teamId)).body.changes.find((c: { id: string }) => c.id === zone.id)
    expect(change).toMatchObject({ entity: 'zone', data: expect.objectContaining({ name: 'Harbour house filter', notes: '' }) })
  })

  it.each([
    [{ tdsPercent: { min: 1.4, max: 1.25 }, yieldPercent: { min: 19, max: 21 } }, /^tdsPercent\.max: /],
    [{ tdsPercent: { min: 1.2, max: 1.4 }, yieldPercent: { min: 0, max: 21 } }, /^yieldPercent\.min: /],
    [{ tdsPercent: { min: 1.2, max: 1.4 }, yieldPercent: { min: 19, max: 120 } }, /^yieldPercent\.max: /],
  ])('refuses an impossible range, naming the limit (%#)', async (ranges, reason) => {
    const result = (await push(app, crew.member, [put('zone', teamId, { name: 'Odd zone', ...ranges })])).body.results[0]
    expect(result).toMatchObject({ status: 'rejected', reason: expect.stringMatching(reason) })
  })
})
