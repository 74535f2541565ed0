import type { EntityName } from '../../shared/schemas/entities'
import type { TestDatabase } from './helpers'
import { mkdtempSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { eq, sql } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { memberships, records, users } from '../../server/db/schema'
import { demoAccounts, demoPassword, seedDemo } from '../../server/db/seed'
import { verifyPassword } from '../../server/services/passwords'
import { createDiskStorage } from '../../server/storage/disk'
import { fileKey } from '../../server/storage/files'
import { isBlindCode } from '../../shared/records/blind-codes'
import { createTestDatabase } from './helpers'

let database: TestDatabase
const files = createDiskStorage(mkdtempSync(path.join(os.tmpdir(), 'lixivia-seed-files-')))
beforeAll(async () => {
  database = await createTestDatabase()
})
afterAll(async () => {
  await database.drop()
})

describe('seedDemo', () => {
  it('writes the demo team with one account per role into an empty database', async () => {
    expect(await seedDemo(database.db, files)).toBe(true)
    const rows = await database.db.select({ email: users.email, role: memberships.role }).from(users).innerJoin(memberships, sql`${memberships.userId} = ${users.id}`)
    expect(rows.map(row => row.role).sort()).toEqual(['lead', 'member', 'owner', 'viewer'])
    expect(rows.map(row => row.email).sort()).toEqual(demoAccounts.map(account => account.email).sort())
  })

  it('writes the demo records through the sync push, so the server derived every brew\'s result', async () => {
    const stored = await database.db.select().from(records).where(eq(records.entity, 'brew'))
    // The week's brews, twenty cupping bowls (four lots, five bowls each), five dial-in attempts and
    // nine pours of competition cups.
    expect(stored).toHaveLength(38)
    for (const brew of stored) {
      expect(brew.derived!.tdsPercent, JSON.stringify(brew.data)).toEqual(expect.any(Number))
      expect(brew.derived!.yieldPercent).toEqual(expect.any(Number))
    }
    const [row] = await database.db.select({ count: sql<number>`count(*)` }).from(records).where(eq(records.entity, 'reading'))
    expect(Number(row!.count)).toBe(84)
  })

  it('writes a competition with one heat signed off and one under way, its cups under random blind codes', async () => {
    const rounds = await database.db.select().from(records).where(eq(records.entity, 'round'))
    expect(rounds.map(round => [round.data.name, Boolean(round.derived)]).sort()).toEqual([['Heat 1', true], ['Heat 2', false]])
    const cups = await database.db.select().from(records).where(eq(records.entity, 'entry'))
    expect(cups).toHaveLength(7)
    expect(new Set(cups.map(cup => cup.data.code)).size).toBe(7)
    expect(cups.every(cup => isBlindCode(String(cup.data.code)) && String(cup.data.contestant).length > 0)).toBe(true)
  })
  it('writes a buying trip with four lots, a cupping table with scores, and two photos whose pictures are stored', async () => {
    const count = async (entity: EntityName) => (await database.db.select().from(records).where(eq(records.entity, entity))).length
    expect(await count('lot')).toBe(4)
    expect(await count('cuppingTable')).toBe(1)
    expect(await count('score')).toBe(8)
    const photos = await database.db.select().from(records).where(eq(records.entity, 'photo'))
    expect(photos).toHaveLength(2)
    for (const photo of photos) {
      const file = await files.get(fileKey(photo.teamId, photo.id))
      file?.stream.destroy()
      expect(file).toMatchObject({ contentType: 'image/jpeg', size: photo.data.sizeBytes })
    }
  })

  it('ends the night market\'s dial-in of five attempts in the crew\'s house recipe, at the version the fifth became', async () => {
    const of = async (entity: EntityName) => database.db.select().from(records).where(eq(records.entity, entity))
    const [session] = await of('dialIn')
    const attempts = (await of('brew')).filter(brew => (brew.data.context as { sessionId?: string }).sessionId === session!.id)
    expect(attempts).toHaveLength(5)
    const [recipe] = await of('recipe')
    const versions = await of('recipeVersion')
    const current = versions.find(version => version.id === recipe!.data.versionId)
    expect(current?.data).toMatchObject({ number: 2, fromBrewId: attempts.find(a => a.data.changeNote === 'One click finer')!.id })
    expect(recipe!.data).toMatchObject({ grindSetting: '17 clicks', waterTemperatureC: 96 })
    const [mark] = await of('houseRecipe')
    expect(mark!.data).toEqual({ method: 'percolation', recipeId: recipe!.id })
  })

  it('stores argon2id hashes that verify the printed password', async () => {
    const [user] = await database.db.select().from(users).limit(1)
    expect(user?.passwordHash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/)
    expect(await verifyPassword(user!.passwordHash, demoPassword)).toBe(true)
    expect(await verifyPassword(user!.passwordHash, 'not the password')).toBe(false)
  })

  it('writes nothing into a database that has data', async () => {
    expect(await seedDemo(database.db)).toBe(false)
    const [row] = await database.db.select({ count: sql<number>`count(*)` }).from(users)
    expect(Number(row?.count)).toBe(demoAccounts.length)
  })
})
