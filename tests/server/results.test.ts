import type { Express } from 'express'
import type { FakeSmtp } from '../../server/mail/fake-smtp'
import type { Role } from '../../shared/schemas/auth'
import type { Account } from './auth-helpers'
import type { TestDatabase } from './helpers'
import { and, eq } from 'drizzle-orm'
import Papa from 'papaparse'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { auditLog, memberships } from '../../server/db/schema'
import { appWithMail, bearer, register, uniqueEmail } from './auth-helpers'
import { createTestDatabase } from './helpers'
import { pourOver, push, put } from './sync-helpers'

let database: TestDatabase
let app: Express
let smtp: FakeSmtp
let teamId: string
const crew = {} as Record<Role, Account>

beforeAll(async () => {
  database = await createTestDatabase()
  ;({ app, smtp } = await appWithMail(database))
  crew.owner = await register(app, 'Owner')
  teamId = (await request(app).post('/api/v1/teams').set(...bearer(crew.owner)).send({ name: 'Breakwater Judges' })).body.team.id
  for (const role of ['lead', 'member', 'viewer'] as const) {
    crew[role] = role === 'member' ? await register(app, 'Ada Fenwick', uniqueEmail('ada')) : await register(app, role)
    await database.db.insert(memberships).values({ teamId, userId: crew[role].id, role })
  }
})
afterAll(async () => {
  await smtp.close()
  await database.drop()
})

const takenAt = '2026-05-01T08:30:00.000Z'
/**
 * A heat judged against the European drip zone (1.20–1.45 %TDS, 18–22 % EY) with 0.05 %TDS and
 * 0.5 % EY allowed: cup KX4M has two pours of 15.0 g → 240.0 g (EY = TDS × 240 / 15 = 16 × TDS),
 * cup T9PH one pour read 1.52 and 1.54 (mean 1.53: 0.08 above, flagged; 24.5 % EY, flagged too).
 */
async function judgedHeat() {
  const gauge = put('instrument', teamId, { label: 'Bar pen', readingKind: 'tds', resolution: 0.01, repeatability: 0.02 })
  const zero = put('zeroCheck', teamId, { instrumentId: gauge.id, kind: 'tds', reading: 0, checkedAt: '2026-05-01T09:00:00.000+02:00' })
  const event = put('event', teamId, { name: 'Spit Head Open', zoneId: 'european-drip', toleranceTdsPercent: 0.05, toleranceYieldPercent: 0.5 })
  const round = put('round', teamId, { eventId: event.id, name: 'Heat 1', position: 1, poursPerCup: 2, readingsPerPour: 2 })
  const kx = put('entry', teamId, { roundId: round.id, code: 'KX4M', contestant: 'Wren Addersley' })
  const t9 = put('entry', teamId, { roundId: round.id, code: 'T9PH', contestant: 'Oona Brackwater' })
  await push(app, crew.lead, [gauge, zero, event, round, kx, t9])
  const pour = (cup: { id: string }, at: string, values: number[]) => {
    const brew = put('brew', teamId, pourOver({ context: { kind: 'entry', refId: cup.id }, instrumentId: gauge.id, dose: 15, beverageGross: null, beverageTare: null, beverageMass: 240, brewedAt: at }))
    return [brew, ...values.map(value => put('reading', teamId, { brewId: brew.id, value, kind: 'tds', instrumentId: gauge.id, takenAt }))]
  }
  const results = (await push(app, crew.member, [...pour(kx, '2026-05-01T08:10:00.000Z', [1.3, 1.32]), ...pour(kx, '2026-05-01T08:20:00.000Z', [1.34, 1.36]), ...pour(t9, '2026-05-01T08:25:00.000Z', [1.52, 1.54])])).body.results
  expect(results.every((r: { status: string }) => r.status === 'applied')).toBe(true)
  return { round }
}

const csvOf = (text: string) => Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true })
const signOff = (roundId: string) => request(app).post(`/api/v1/teams/${teamId}/rounds/${roundId}/sign-off`).set(...bearer(crew.lead)).expect(200)

describe('GET /api/v1/teams/:teamId/rounds/:roundId/results.csv', () => {
  it('gives a lead one row per reading, worked out on the server, with the competitor', async () => {
    const { round } = await judgedHeat()
    const response = await request(app).get(`/api/v1/teams/${teamId}/rounds/${round.id}/results.csv`).set(...bearer(crew.lead))
    expect(response.status).toBe(200)
    expect(response.headers['content-type']).toMatch(/^text\/csv/)
    expect(response.headers['content-disposition']).toBe('attachment; filename="spit-head-open-heat-1-results.csv"')
    const { data, meta } = csvOf(response.text)
    expect(meta.fields!.slice(0, 7)).toEqual(['code', 'competitor', 'pour', 'reading', 'tds_percent', 'extraction_percent', 'flag'])
    expect(data).toHaveLength(6)
    // Worked by hand: each reading alone, 16 × TDS for the EY; pour 1 mean 1.31, pours' mean 1.33.
    expect(data.slice(0, 4).map(row => [row.code, row.competitor, row.pour, row.reading, row.tds_percent, row.extraction_percent])).toEqual([
      ['KX4M', 'Wren Addersley', '1', '1', '1.30', '20.8'],
      ['KX4M', 'Wren Addersley', '1', '2', '1.32', '21.1'],
      ['KX4M', 'Wren Addersley', '2', '1', '1.34', '21.4'],
      ['KX4M', 'Wren Addersley', '2', '2', '1.36', '21.8'],
    ])
    expect(data[0]).toMatchObject({ pour_tds_percent: '1.31', cup_mean_tds_percent: '1.33', cup_mean_extraction_percent: '21.3', dose_g: '15.0', beverage_g: '240.0', judge: 'Ada Fenwick', instrument: 'Bar pen', calibration: 'readings in %TDS', flag: '' })
    // The zero check was made at 09:00 +02:00, the readings at 10:30 that day where it was made.
    expect(data[0]!.zero_check).toBe('passed 2026-05-01T07:00Z')
    // 1.53 %TDS × 16 = 24.48 % EY, 2.5 above 22.
    expect(data[4]).toMatchObject({ code: 'T9PH', flag: 'strength 0.08 %TDS above the zone, 0.03 past the 0.05 allowed; extraction 2.5 % EY above the zone, 2.0 past the 0.5 allowed', time: '2026-05-01T08:30Z' })
  })

  it('is refused to members and viewers before sign-off, then shows them the competitors', async () => {
    const { round } = await judgedHeat()
    for (const role of ['member', 'viewer'] as const)
      expect((await request(app).get(`/api/v1/teams/${teamId}/rounds/${round.id}/results.csv`).set(...bearer(crew[role]))).status).toBe(403)
    await signOff(round.id)
    const response = await request(app).get(`/api/v1/teams/${teamId}/rounds/${round.id}/results.csv`).set(...bearer(crew.member))
    expect(response.status).toBe(200)
    expect(csvOf(response.text).data[0]!.competitor).toBe('Wren Addersley')
  })

  it('answers 404 for a round of another team', async () => {
    const outsider = await register(app, 'Outsider')
    const { round } = await judgedHeat()
    expect((await request(app).get(`/api/v1/teams/${teamId}/rounds/${round.id}/results.csv`).set(...bearer(outsider))).status).toBe(404)
  })
})

describe('POST /api/v1/teams/:teamId/rounds/:roundId/results/email', () => {
  const send = (roundId: string, who: Account, body: object) => request(app).post(`/api/v1/teams/${teamId}/rounds/${roundId}/results/email`).set(...bearer(who)).send(body)

  it('refuses members and viewers, a round not signed off, and a bad address naming `to`', async () => {
    const { round } = await judgedHeat()
    for (const role of ['member', 'viewer'] as const)
      expect((await send(round.id, crew[role], { to: 'desk@spit-head.test' })).status).toBe(403)
    const early = await send(round.id, crew.lead, { to: 'desk@spit-head.test' })
    expect(early.status).toBe(409)
    expect(early.body.error.code).toBe('not_signed_off')
    await signOff(round.id)
    const bad = await send(round.id, crew.lead, { to: 'not an address' })
    expect(bad.status).toBe(400)
    expect(bad.body.error.issues[0].path).toBe('to')
  })

  it('sends the CSV attached through the mailer after sign-off, and logs it', async () => {
    const { round } = await judgedHeat()
    await signOff(round.id)
    const response = await send(round.id, crew.owner, { to: 'Results@Spit-Head.test' })
    expect(response.status).toBe(202)
    expect(response.body.sent).toEqual({ to: 'results@spit-head.test', filename: 'spit-head-open-heat-1-results.csv', rows: 6 })
    const mail = await smtp.mailbox.waitFor('results@spit-head.test')
    expect(mail.subject).toBe('Results: Spit Head Open · Heat 1')
    expect(mail.text).toContain('T9PH  Oona Brackwater  1.53 %TDS · 24.5 % EY  flagged: strength 0.08 %TDS above the zone')
    expect(mail.attachments).toHaveLength(1)
    expect(mail.attachments[0]).toMatchObject({ filename: 'spit-head-open-heat-1-results.csv', contentType: 'text/csv' })
    const attached = Buffer.from(mail.attachments[0]!.content, 'base64').toString('utf8')
    expect(csvOf(attached).data.map(row => row.competitor)).toContain('Oona Brackwater')
    const logged = await database.db.select().from(auditLog).where(and(eq(auditLog.subjectId, round.id), eq(auditLog.action, 'round.results_emailed')))
    expect(logged[0]).toMatchObject({ actorId: crew.owner.id, detail: { to: 'results@spit-head.test', rows: 6 } })
  })
})
