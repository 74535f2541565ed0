import type { RowDataPacket } from 'mysql2/promise'
import type { EntityName } from '../../shared/schemas/entities'
import type { TestDatabase } from './helpers'
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { drizzle } from 'drizzle-orm/mysql2'
import { migrate } from 'drizzle-orm/mysql2/migrator'
import mysql from 'mysql2/promise'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { createDatabase } from '../../server/db/client'
import { migrationsFolder, runMigrations } from '../../server/db/migrate'
import { historyShown } from '../../server/sync/store'
import { recordSchemaOf } from '../../shared/schemas/records'
import { buildTestApp } from './helpers'
import { push, put, reading } from './sync-helpers'
import { fixtureIds, lastRev, oid, oldAnswers, oldPassword, oldRecords, people, quietTeamId, sqlTime, teamId, writeOldRelease } from './upgrade-fixture'

/** The migrations of the release before the one-table records (0000–0003), in a folder of their own. */
function previousReleaseMigrations(): string {
  const folder = mkdtempSync(path.join(os.tmpdir(), 'lixivia-old-migrations-'))
  mkdirSync(path.join(folder, 'meta'))
  const journal = JSON.parse(readFileSync(path.join(migrationsFolder, 'meta', '_journal.json'), 'utf8')) as { entries: { tag: string }[] }
  const entries = journal.entries.filter(entry => entry.tag < '0004')
  for (const entry of entries)
    copyFileSync(path.join(migrationsFolder, `${entry.tag}.sql`), path.join(folder, `${entry.tag}.sql`))
  writeFileSync(path.join(folder, 'meta', '_journal.json'), JSON.stringify({ ...journal, entries }))
  return folder
}

let database: TestDatabase
let url: string

beforeAll(async () => {
  const adminUrl = new URL(inject('adminUrl'))
  const name = `t_upgrade_${Date.now().toString(36)}`
  const admin = await mysql.createConnection({ uri: adminUrl.toString() })
  await admin.query(`CREATE DATABASE ${mysql.escapeId(name)} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
  await admin.end()
  adminUrl.pathname = `/${name}`
  url = adminUrl.toString()
  const connection = await mysql.createConnection({ uri: url, timezone: 'Z' })
  await migrate(drizzle(connection), { migrationsFolder: previousReleaseMigrations() })
  await writeOldRelease(connection)
  await connection.end()
  // What `npm start` does at every start: every migration not yet applied.
  await runMigrations(url)
  const opened = createDatabase(url, { connectionLimit: 3 })
  database = { ...opened, url, name, drop: async () => {
    await opened.pool.end()
    const connection = await mysql.createConnection({ uri: inject('adminUrl') })
    await connection.query(`DROP DATABASE IF EXISTS ${mysql.escapeId(name)}`)
    await connection.end()
  } }
}, 120_000)
afterAll(async () => database?.drop())

async function rows<T>(sql: string, values: unknown[] = []): Promise<T[]> {
  const [found] = await database.pool.query<RowDataPacket[]>(sql, values)
  return found as T[]
}

interface RecordRow { id: string, entity: EntityName, team_id: string, created_by: string, created_at: Date, updated_at: Date, rev: number, deleted_at: Date | null, data: unknown, derived: unknown, field_revs: unknown, history: unknown, history_count: number, parent_id: string | null }
const toSql = (date: Date | null): string | null => (date ? date.toISOString().replace('T', ' ').replace('Z', '') : null)

async function signIn(email: string) {
  const app = buildTestApp(database)
  const response = await request(app).post('/api/v1/auth/login').send({ email, password: oldPassword })
  expect(response.status).toBe(200)
  return { app, account: { id: response.body.user.id as string, email, token: response.body.accessToken as string, cookie: '' } }
}

describe('migrations on the previous release\'s data', () => {
  it('move every old record into the records table with its envelope, data and parent', async () => {
    const found = new Map((await rows<RecordRow>('SELECT * FROM records')).map(row => [row.id, row]))
    expect(found.size).toBe(oldRecords.length)
    for (const old of oldRecords) {
      const row = found.get(old.id)
      expect(row, old.id).toBeDefined()
      expect({ entity: row!.entity, team: row!.team_id, by: row!.created_by, rev: row!.rev, data: row!.data, fieldRevs: row!.field_revs, parent: row!.parent_id, deletedAt: toSql(row!.deleted_at) })
        .toEqual({ entity: old.entity, team: teamId, by: old.createdBy, rev: old.rev, data: old.data, fieldRevs: old.fieldRevs ?? {}, parent: old.parent, deletedAt: old.deletedAt ?? null })
      if (old.entity !== 'round')
        expect(row!.derived).toEqual(old.derived ?? null)
      expect(toSql(row!.updated_at)).toBe(sqlTime(new Date(Date.UTC(2026, 10, 20, 8, old.rev)).toISOString()))
    }
  })

  it('turn a round\'s sign-off columns into what the server derives for it', async () => {
    const [round] = await rows<RecordRow>('SELECT derived FROM records WHERE id = ?', [fixtureIds.heat])
    expect(round!.derived).toEqual({ signedOffAt: '2026-11-20T09:50:00.123Z', signedOffBy: people.lead })
  })

  it('keep every history entry in record_history and the latest ones on the record', async () => {
    for (const old of oldRecords.filter(r => r.history)) {
      const [row] = await rows<RecordRow>('SELECT history, history_count FROM records WHERE id = ?', [old.id])
      const kept = await rows<{ rev: number, entry: unknown }>('SELECT rev, entry FROM record_history WHERE record_id = ? ORDER BY rev', [old.id])
      expect(kept.map(k => k.entry)).toEqual(old.history)
      expect(kept.map(k => k.rev)).toEqual(old.history!.map(h => h.rev))
      expect(row!.history_count).toBe(old.history!.length)
      expect(row!.history).toEqual(old.history!.slice(-historyShown))
    }
  })

  it('keep the accounts, the audit trail and the answers already given', async () => {
    expect(await rows('SELECT COUNT(*) AS n FROM users')).toEqual([{ n: 3 }])
    expect(await rows('SELECT COUNT(*) AS n FROM memberships')).toEqual([{ n: 4 }])
    expect(await rows('SELECT action FROM audit_log ORDER BY id')).toEqual([{ action: 'auth.login' }, { action: 'membership.role_changed' }])
    expect(await rows('SELECT user_id, client_id, mutation_id FROM sync_mutations')).toEqual(oldAnswers.map(a => ({ user_id: a.userId, client_id: a.clientId, mutation_id: a.mutationId })))
    expect(await rows('SELECT team_id, last_rev FROM team_sync_state ORDER BY team_id')).toEqual([{ team_id: teamId, last_rev: lastRev }, { team_id: quietTeamId, last_rev: 0 }])
  })

  it('serve every old record to a phone in today\'s record shape, history included', async () => {
    const { app, account } = await signIn('owner@kestrel-quay.test')
    const pulled = await request(app).get('/api/v1/sync/pull').query({ teamId }).set('Authorization', `Bearer ${account.token}`)
    expect(pulled.status).toBe(200)
    const changes = pulled.body.changes as { entity: EntityName, id: string, op: string, data: Record<string, unknown> }[]
    expect(changes.map(c => c.id).sort()).toEqual(oldRecords.map(r => r.id).sort())
    for (const change of changes) {
      const parsed = recordSchemaOf(change.entity).safeParse(change.data)
      expect(parsed.success, `${change.entity} ${change.id}: ${parsed.error?.message}`).toBe(true)
    }
    expect(changes.find(c => c.id === fixtureIds.dropped)?.op).toBe('delete')
    const history = await request(app).get(`/api/v1/teams/${teamId}/records/${fixtureIds.corrected}/history`).set('Authorization', `Bearer ${account.token}`)
    expect(history.body.history).toHaveLength(26)
    expect(history.body.history[0]).toMatchObject({ rev: 45, reason: 'Scale read before the drip-through ended' })
  })

  it('go on numbering, deriving and freezing as before once phones push again', async () => {
    const member = await signIn('member@kestrel-quay.test')
    const lead = await signIn('lead@kestrel-quay.test')
    const owner = await signIn('owner@kestrel-quay.test')
    const added = await push(member.app, member.account, [put('reading', teamId, reading(fixtureIds.quick, 1.35), { id: oid(200) })])
    expect(added.body.results[0]).toMatchObject({ status: 'applied', rev: lastRev + 1 })
    const [quick] = await rows<RecordRow>('SELECT derived, rev, history_count FROM records WHERE id = ?', [fixtureIds.quick])
    expect(quick).toMatchObject({ rev: lastRev + 2, history_count: 1 })
    expect((quick!.derived as { tdsPercent: number }).tdsPercent).toBeCloseTo((1.31 + 1.33 + 1.35) / 3, 6)

    const frozen = await push(lead.app, lead.account, [put('brew', teamId, { notes: 'too late' }, { id: fixtureIds.cup, baseRev: 23, reason: 'retyped' })])
    expect(frozen.body.results[0]).toMatchObject({ status: 'rejected' })
    expect(frozen.body.results[0].reason).toMatch(/signed off/)

    const again = await push(owner.app, owner.account, [{ mutationId: oldAnswers[0]!.mutationId, entity: 'instrument', op: 'put', id: oid(201), teamId, data: { label: 'Repeat', readingKind: 'tds', resolution: 0.01, repeatability: 0.02 }, baseRev: null }], oldAnswers[0]!.clientId)
    expect(again.body.results[0]).toEqual(oldAnswers[0]!.result)
    expect(await rows('SELECT id FROM records WHERE id = ?', [oid(201)])).toEqual([])

    const quiet = await push(owner.app, owner.account, [put('instrument', quietTeamId, { label: 'Market pen', readingKind: 'tds', resolution: 0.01, repeatability: 0.02 })])
    expect(quiet.body.results[0]).toMatchObject({ status: 'applied', rev: 1 })
  })
})
