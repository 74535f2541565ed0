import type { EntityName } from '../../shared/schemas/entities'
import type { HistoryEntry } from '../../shared/schemas/records'
import { sql } from 'drizzle-orm'
import { bigint, char, datetime, index, int, json, mysqlEnum, mysqlTable, primaryKey, uniqueIndex, varchar } from 'drizzle-orm/mysql-core'

/** Every id is a UUID (v7 where the client makes it), kept as its 36-character text form. */
const uuid = (name: string) => char(name, { length: 36 })
const createdAt = () => datetime('created_at', { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`)
const updatedAt = () => datetime('updated_at', { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`)

export const roles = ['owner', 'lead', 'member', 'viewer'] as const

export const users = mysqlTable('users', {
  id: uuid('id').primaryKey(),
  email: varchar('email', { length: 254 }).notNull(),
  name: varchar('name', { length: 120 }).notNull(),
  passwordHash: varchar('password_hash', { length: 255 }).notNull(),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, table => [uniqueIndex('users_email_unique').on(table.email)])

export const teams = mysqlTable('teams', {
  id: uuid('id').primaryKey(),
  name: varchar('name', { length: 120 }).notNull(),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
})

export const memberships = mysqlTable('memberships', {
  teamId: uuid('team_id').notNull().references(() => teams.id, { onDelete: 'cascade' }),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  role: mysqlEnum('role', roles).notNull(),
  createdAt: createdAt(),
}, table => [
  primaryKey({ columns: [table.teamId, table.userId] }),
  index('memberships_user_idx').on(table.userId),
])

/** SHA-256 of a secret token in hex: tokens themselves are never stored. */
const tokenHash = (name: string) => char(name, { length: 64 })
const when = (name: string) => datetime(name, { fsp: 3 })

/**
 * Refresh tokens, one row per issued token. A sign-in starts a family; each refresh marks its token
 * used and issues the next in the same family. Presenting a used token revokes the whole family.
 */
export const refreshTokens = mysqlTable('refresh_tokens', {
  id: uuid('id').primaryKey(),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  familyId: uuid('family_id').notNull(),
  tokenHash: tokenHash('token_hash').notNull(),
  createdAt: createdAt(),
  expiresAt: when('expires_at').notNull(),
  usedAt: when('used_at'),
  revokedAt: when('revoked_at'),
}, table => [
  uniqueIndex('refresh_tokens_hash_unique').on(table.tokenHash),
  index('refresh_tokens_family_idx').on(table.familyId),
  index('refresh_tokens_user_idx').on(table.userId),
])

export const passwordResets = mysqlTable('password_resets', {
  id: uuid('id').primaryKey(),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  tokenHash: tokenHash('token_hash').notNull(),
  createdAt: createdAt(),
  expiresAt: when('expires_at').notNull(),
  usedAt: when('used_at'),
}, table => [uniqueIndex('password_resets_hash_unique').on(table.tokenHash)])

export const invitations = mysqlTable('invitations', {
  id: uuid('id').primaryKey(),
  teamId: uuid('team_id').notNull().references(() => teams.id, { onDelete: 'cascade' }),
  email: varchar('email', { length: 254 }).notNull(),
  role: mysqlEnum('role', roles).notNull(),
  tokenHash: tokenHash('token_hash').notNull(),
  invitedBy: uuid('invited_by').notNull().references(() => users.id, { onDelete: 'cascade' }),
  createdAt: createdAt(),
  expiresAt: when('expires_at').notNull(),
  acceptedAt: when('accepted_at'),
  acceptedBy: uuid('accepted_by'),
  revokedAt: when('revoked_at'),
}, table => [
  uniqueIndex('invitations_hash_unique').on(table.tokenHash),
  index('invitations_team_idx').on(table.teamId),
])

/** Who did what, when: sign-ins, role changes, invitations, password resets. Rows are never edited. */
export const auditLog = mysqlTable('audit_log', {
  id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
  action: varchar('action', { length: 64 }).notNull(),
  actorId: uuid('actor_id'),
  teamId: uuid('team_id'),
  subjectId: varchar('subject_id', { length: 64 }),
  detail: json('detail').$type<Record<string, unknown>>(),
  ip: varchar('ip', { length: 45 }),
  createdAt: createdAt(),
}, table => [
  index('audit_log_team_idx').on(table.teamId, table.createdAt),
  index('audit_log_actor_idx').on(table.actorId, table.createdAt),
])

/**
 * Every synced record of every entity, in one table: the envelope every record shares, the phone's
 * data as validated JSON (the zod schemas in shared/schemas/entities.ts are its shape), what the
 * server derives from it, and the rev at which each field last changed, so edits of different
 * fields merge instead of clashing. A team's changes are one range of (team_id, rev), so a pull is
 * one indexed query whatever the entity; `parent_id` is the record it belongs to
 * (shared/records/registry.ts), indexed for "the readings of this brew" and the like.
 */
export const records = mysqlTable('records', {
  id: uuid('id').primaryKey(),
  entity: varchar('entity', { length: 24 }).$type<EntityName>().notNull(),
  teamId: uuid('team_id').notNull().references(() => teams.id, { onDelete: 'cascade' }),
  createdBy: uuid('created_by').notNull(),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
  rev: bigint('rev', { mode: 'number', unsigned: true }).notNull(),
  deletedAt: when('deleted_at'),
  data: json('data').$type<Record<string, unknown>>().notNull(),
  derived: json('derived').$type<Record<string, unknown>>(),
  fieldRevs: json('field_revs').$type<Record<string, number>>().notNull(),
  /** The latest edits, deletes and restores, oldest first; `record_history` keeps all of them. */
  history: json('history').$type<HistoryEntry[]>(),
  historyCount: int('history_count', { unsigned: true }).notNull().default(0),
  parentId: uuid('parent_id'),
}, table => [
  uniqueIndex('records_team_rev_unique').on(table.teamId, table.rev),
  index('records_parent_idx').on(table.parentId, table.entity),
  index('records_team_entity_idx').on(table.teamId, table.entity),
])

/** Every history entry of every record, one row per record and rev: the full audit trail. */
export const recordHistory = mysqlTable('record_history', {
  recordId: uuid('record_id').notNull().references(() => records.id, { onDelete: 'cascade' }),
  rev: bigint('rev', { mode: 'number', unsigned: true }).notNull(),
  entry: json('entry').$type<HistoryEntry>().notNull(),
}, table => [primaryKey({ columns: [table.recordId, table.rev] })])

/** Per team, the last rev handed out; made with the team and locked inside each push, so commits happen in rev order. */
export const teamSyncState = mysqlTable('team_sync_state', {
  teamId: uuid('team_id').primaryKey().references(() => teams.id, { onDelete: 'cascade' }),
  lastRev: bigint('last_rev', { mode: 'number', unsigned: true }).notNull().default(0),
})

/**
 * Every mutation a phone delivered, with the answer it got: a repeated delivery gets it again, but
 * only from the person who sent it (an answer may hold the server's copy of a record).
 */
export const syncMutations = mysqlTable('sync_mutations', {
  userId: uuid('user_id').notNull(),
  clientId: uuid('client_id').notNull(),
  mutationId: uuid('mutation_id').notNull(),
  result: json('result').$type<Record<string, unknown>>().notNull(),
  createdAt: createdAt(),
}, table => [primaryKey({ columns: [table.userId, table.clientId, table.mutationId] })])
