import type { Express } from 'express'
import type { Role } from '../../shared/schemas/auth'
import type { Account } from './auth-helpers'
import type { TestDatabase } from './helpers'
import request from 'supertest'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { memberships } from '../../server/db/schema'
import { scoreIdOf } from '../../shared/records/rules'
import { bearer, register } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'
import { now, pull, push, put, reading } from './sync-helpers'

let database: TestDatabase
let app: Express
let teamId: string
const crew = {} as Record<Role, Account>

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
  crew.owner = await register(app, 'Owner')
  teamId = (await request(app).post('/api/v1/teams').set(...bearer(crew.owner)).send({ name: 'Upland Sample Room' })).body.team.id
  for (const role of ['lead', 'member', 'viewer'] as const) {
    crew[role] = await register(app, role)
    await database.db.insert(memberships).values({ teamId, userId: crew[role].id, role })
  }
})
afterAll(async () => {
  await database.drop()
})

const first = async (account: Account, mutation: ReturnType<typeof put>) => (await push(app, account, [mutation])).body.results[0]
const trip = () => put('trip', teamId, { name: 'Upland sample run', origin: 'Upland Bends' })
const lot = (tripId: string, extra: Record<string, unknown> = {}) => put('lot', teamId, { tripId, farm: 'Fernhollow Terraces', ...extra })

describe('a lot at origin', () => {
  it('sent by a phone that knows none of the grading fields, is stored with their defaults', async () => {
    const t = trip()
    await first(crew.member, t)
    const l = lot(t.id, { moisturePercent: 10.9 })
    expect((await first(crew.member, l)).status).toBe('applied')
    const stored = (await pull(app, crew.viewer, teamId)).body.changes.find((c: { id: string }) => c.id === l.id).data
    expect(stored).toMatchObject({ decision: 'open', priceUnit: 'kg', altitudeMinM: null, primaryDefects: null, decisionReason: '', reference: '' })
  })

  it.each([
    [{ waterActivity: 1.2 }, 'waterActivity: must be at most 1'],
    [{ densityGPerL: -5 }, 'densityGPerL: must be more than zero'],
    [{ primaryDefects: 2.5 }, 'primaryDefects: must be a whole number'],
    [{ altitudeMinM: 1800, altitudeMaxM: 1600 }, 'altitudeMaxM: must not be below the lower altitude'],
    [{ decision: 'buy' }, 'decision: '],
    [{ currency: 'eur' }, 'currency: must be a three-letter currency code'],
  ])('refuses %o, naming the field', async (extra, reason) => {
    const t = trip()
    await first(crew.member, t)
    const result = await first(crew.member, lot(t.id, extra))
    expect(result.status).toBe('rejected')
    expect(result.reason).toMatch(new RegExp(`^${reason.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`))
  })
})

describe('a cupping table and its bowls', () => {
  it('names lots that exist, and a bowl names a table that exists', async () => {
    const t = trip()
    const l = lot(t.id)
    await push(app, crew.member, [t, l])
    expect((await first(crew.member, put('cuppingTable', teamId, { tripId: t.id, heldOn: '2026-11-28', lotIds: [l.id, uuidv7()] }))).reason).toMatch(/lot this record belongs to is not on the server/)
    expect((await first(crew.member, put('cuppingTable', teamId, { tripId: t.id, heldOn: '2026-11-28', lotIds: [l.id, l.id] }))).reason).toBe('lotIds: names a lot twice')
    const table = put('cuppingTable', teamId, { tripId: t.id, heldOn: '2026-11-28', lotIds: [l.id] })
    expect((await first(crew.member, table)).status).toBe('applied')
    const stored = (await pull(app, crew.member, teamId)).body.changes.find((c: { id: string }) => c.id === table.id).data
    // The SCA cupping protocol's 8.25 g per 150 mL, five bowls a lot, unless the table says otherwise.
    expect(stored).toMatchObject({ doseG: 8.25, waterMl: 150, bowlsPerLot: 5 })

    const bowl = (tableId: string) => put('brew', teamId, { context: { kind: 'lot', refId: l.id, tableId }, method: 'immersion', strengthSource: 'direct', dose: 8.25, waterMass: 150, brewedAt: now() })
    expect((await first(crew.member, bowl(uuidv7()))).reason).toMatch(/cupping table this record belongs to is not on the server/)
    const good = bowl(table.id)
    const results = (await push(app, crew.member, [good, put('reading', teamId, reading(good.id, 1.12))])).body.results
    expect(results.map((r: { status: string }) => r.status)).toEqual(['applied', 'applied'])
    const brew = (await pull(app, crew.member, teamId)).body.changes.find((c: { id: string }) => c.id === good.id).data
    expect(brew.context).toEqual({ kind: 'lot', refId: l.id, tableId: table.id })
    // Full immersion from the water: EY = W × TDS / ((1 − TDS) × dose) = 150 × 0.0112 / (0.9888 × 8.25).
    expect(brew.derived.yieldPercent).toBeCloseTo(100 * 150 * 0.0112 / (0.9888 * 8.25), 9)
  })
})

describe('scores', () => {
  it('keep one per taster per lot per table: the id comes from all three', async () => {
    const t = trip()
    const l = lot(t.id)
    const table = put('cuppingTable', teamId, { tripId: t.id, heldOn: '2026-11-28', lotIds: [l.id] })
    await push(app, crew.member, [t, l, table])
    const values = [{ attribute: 'flavour', value: 8 }]
    expect((await first(crew.member, put('score', teamId, { tableId: table.id, lotId: l.id, values }))).reason).toMatch(/one score per lot on a table/)
    // Someone else's id for this lot is refused too.
    expect((await first(crew.member, put('score', teamId, { tableId: table.id, lotId: l.id, values }, { id: scoreIdOf(table.id, l.id, crew.lead.id) }))).status).toBe('rejected')
    const mine = put('score', teamId, { tableId: table.id, lotId: l.id, values }, { id: scoreIdOf(table.id, l.id, crew.member.id) })
    expect((await first(crew.member, mine)).status).toBe('applied')
    // The same taster's second phone, which never saw the first copy, meets it as a conflict.
    const again = await first(crew.member, put('score', teamId, { tableId: table.id, lotId: l.id, values: [{ attribute: 'flavour', value: 7.5 }] }, { id: mine.id }))
    expect(again.status).toBe('conflict')
    expect((await first(crew.lead, put('score', teamId, { tableId: table.id, lotId: l.id, values }, { id: scoreIdOf(table.id, l.id, crew.lead.id) }))).status).toBe('applied')
  })

  it('sit on sheets only a lead or an owner sets up', async () => {
    const sheet = { name: 'Harvest check', attributes: [{ key: 'sweetness', label: 'Sweetness' }], scaleMin: 0, scaleMax: 5, step: 0.5 }
    expect((await first(crew.member, put('scoreSheet', teamId, sheet))).reason).toMatch(/Only a lead or an owner can set up or change score sheets/)
    expect((await first(crew.lead, put('scoreSheet', teamId, sheet))).status).toBe('applied')
    expect((await first(crew.lead, put('scoreSheet', teamId, { ...sheet, scaleMax: 0 }))).reason).toMatch(/^scaleMax: /)
  })
})

describe('photo records', () => {
  it('sync as any record, name what they show, and are refused to viewers', async () => {
    const t = trip()
    const l = lot(t.id)
    await push(app, crew.member, [t, l])
    const photo = { subject: 'lot', lotId: l.id, contentType: 'image/jpeg', sizeBytes: 182_000, width: 1600, height: 1200, takenAt: now() }
    expect((await first(crew.viewer, put('photo', teamId, photo))).reason).toMatch(/Viewers/)
    expect((await first(crew.member, put('photo', teamId, { ...photo, lotId: null }))).reason).toBe('lotId: must name the lot, bowl or trip the photo belongs to')
    expect((await first(crew.member, put('photo', teamId, { ...photo, subject: 'bowl' }))).reason).toBe('brewId: must name the bowl a bowl photo shows')
    expect((await first(crew.member, put('photo', teamId, { ...photo, contentType: 'image/gif' }))).reason).toMatch(/^contentType: /)
    const good = put('photo', teamId, photo)
    expect((await first(crew.member, good)).status).toBe('applied')
    const stored = (await pull(app, crew.viewer, teamId)).body.changes.find((c: { id: string }) => c.id === good.id).data
    expect(stored).toMatchObject({ subject: 'lot', lotId: l.id, createdBy: crew.member.id })
  })
})
