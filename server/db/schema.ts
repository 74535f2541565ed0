import type { MySqlColumnBuilderBase } from 'drizzle-orm/mysql-core'
import type { HistoryEntry } from '../../shared/schemas/entities'
import { sql } from 'drizzle-orm'
import { bigint, char, datetime, index, json, mysqlEnum, mysqlTable, primaryKey, uniqueIndex, varchar } from 'drizzle-orm/mysql-core'

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
 * A synced record table: the envelope every record shares, the phone's data as validated JSON (the
 * zod schemas in shared/schemas/entities.ts are its shape), what the server derives from it, and
 * the rev at which each field last changed, so edits of different fields merge instead of clashing.
 * References to other records get real, indexed columns.
 */
function recordTable<T extends Record<string, MySqlColumnBuilderBase>>(name: string, references: T) {
  return mysqlTable(name, {
    id: uuid('id').primaryKey(),
    teamId: uuid('team_id').notNull().references(() => teams.id, { onDelete: 'cascade' }),
    createdBy: uuid('created_by').notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    rev: bigint('rev', { mode: 'number', unsigned: true }).notNull(),
    deletedAt: when('deleted_at'),
    data: json('data').$type<Record<string, unknown>>().notNull(),
    derived: json('derived').$type<Record<string, unknown>>(),
    fieldRevs: json('field_revs').$type<Record<string, number>>().notNull(),
    /** Every edit, delete and restore after creation, oldest first (HistoryEntry in shared/schemas). */
    history: json('history').$type<HistoryEntry[]>(),
    ...references,
  }, table => [
    index(`${name}_team_rev_idx`).on(table.teamId, table.rev),
    ...Object.keys(references).map(key => index(`${name}_${key.replace(/[A-Z]/g, c => `_${c.toLowerCase()}`)}_idx`).on(table[key as keyof typeof table] as never)),
  ])
}

const ref = (name: string) => uuid(name)

export const instruments = recordTable('instruments', {})
export const calibrations = recordTable('calibrations', { instrumentId: ref('instrument_id') })
export const brews = recordTable('brews', { contextRefId: ref('context_ref_id'), calibrationId: ref('calibration_id') })
export const readings = recordTable('readings', { brewId: ref('brew_id') })
export const events = recordTable('events', {})
export const rounds = recordTable('rounds', { eventId: ref('event_id'), signedOffAt: when('signed_off_at'), signedOffBy: uuid('signed_off_by') })
export const entries = recordTable('entries', { roundId: ref('round_id') })
export const trips = recordTable('trips', {})
export const lots = recordTable('lots', { tripId: ref('trip_id') })
export const recipes = recordTable('recipes', {})
export const zones = recordTable('zones', {})

/** Per team, the last rev handed out. Locked inside each push, so commits happen in rev order. */
export const teamSyncState = mysqlTable('team_sync_state', {
  teamId: uuid('team_id').primaryKey().references(() => teams.id, { onDelete: 'cascade' }),
  lastRev: bigint('last_rev', { mode: 'number', unsigned: true }).notNull().default(0),
})

/** Every mutation a phone delivered, with the answer it got: a repeated delivery gets it again. */
export const syncMutations = mysqlTable('sync_mutations', {
  clientId: uuid('client_id').notNull(),
  mutationId: uuid('mutation_id').notNull(),
  userId: uuid('user_id').notNull(),
  result: json('result').$type<Record<string, unknown>>().notNull(),
  createdAt: createdAt(),
}, table => [primaryKey({ columns: [table.clientId, table.mutationId] })])
