import { sql } from 'drizzle-orm'
import { char, datetime, index, mysqlEnum, mysqlTable, primaryKey, uniqueIndex, varchar } from 'drizzle-orm/mysql-core'

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
