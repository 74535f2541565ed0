import type { Express } from 'express'
import type { Account } from './auth-helpers'
import type { TestDatabase } from './helpers'
import { asc, eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { memberships, records } from '../../server/db/schema'
import { bearer, register } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'
import { instrument, pourOver, push, put, reading } from './sync-helpers'

// When signal returns at a venue every phone pushes at once: pushes to one team must queue on the
// team's counter (never deadlock, never answer 500), and pushes to other teams must not wait on them.

let database: TestDatabase
let app: Express
let owner: Account

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
  owner = await register(app, 'owner')
})
afterAll(async () => {
  await database.drop()
})

const newTeam = async (name: string): Promise<string> => (await request(app).post('/api/v1/teams').set(...bearer(owner)).send({ name })).body.team.id

/** Every rev of a team, in order: 1 … n with no gap and no repeat. */
async function revsOf(teamId: string): Promise<number[]> {
  return (await database.db.select({ rev: records.rev }).from(records).where(eq(records.teamId, teamId)).orderBy(asc(records.rev))).map(row => row.rev)
}

describe('concurrent pushes', () => {
  it('to one team all apply, in one unbroken run of revs', async () => {
    const teamId = await newTeam('Crowded Bar')
    const responses = await Promise.all(Array.from({ length: 10 }, (_, i) => push(app, owner, Array.from({ length: 5 }, (__, j) => put('instrument', teamId, instrument(`Pen ${i}.${j}`))))))
    expect(responses.map(r => r.status)).toEqual(Array.from({ length: 10 }, () => 200))
    expect(responses.flatMap(r => r.body.results.map((x: { status: string }) => x.status)).every(s => s === 'applied')).toBe(true)
    expect(await revsOf(teamId)).toEqual(Array.from({ length: 50 }, (_, i) => i + 1))
  })

  it('from 30 phones on one team, each a brew with its readings, never answer 500', async () => {
    const teamId = await newTeam('Festival Crew')
    const phones = await Promise.all(Array.from({ length: 30 }, (_, i) => register(app, `phone${i}`)))
    await database.db.insert(memberships).values(phones.map(phone => ({ teamId, userId: phone.id, role: 'member' as const })))
    const responses = await Promise.all(phones.map((phone) => {
      const brew = put('brew', teamId, pourOver())
      return push(app, phone, [brew, ...[1.34, 1.35, 1.36].map(value => put('reading', teamId, reading(brew.id, value)))])
    }))
    expect(responses.filter(r => r.status !== 200).map(r => r.status)).toEqual([])
    const revs = await revsOf(teamId)
    expect(revs).toEqual(Array.from({ length: revs.length }, (_, i) => i + 1))
    // Each brew's result was derived once its readings were in.
    const brews = await database.db.select().from(records).where(eq(records.teamId, teamId))
    expect(brews.filter(row => row.entity === 'brew').every(row => (row.derived as { tdsPercent: number }).tdsPercent > 1.34)).toBe(true)
  })

  it('to 12 teams at once pass each other', async () => {
    const teams = await Promise.all(Array.from({ length: 12 }, (_, i) => newTeam(`Stall ${i}`)))
    const responses = await Promise.all(teams.flatMap(teamId => [0, 1].map(k => push(app, owner, Array.from({ length: 4 }, (_, j) => put('instrument', teamId, instrument(`Stall pen ${k}.${j}`)))))))
    expect(responses.filter(r => r.status !== 200).map(r => r.status)).toEqual([])
    for (const teamId of teams)
      expect(await revsOf(teamId)).toEqual([1, 2, 3, 4, 5, 6, 7, 8])
  })
})
