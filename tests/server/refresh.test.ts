import type { Express } from 'express'
import type { TestDatabase } from './helpers'
import { and, eq, isNotNull } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { auditLog, refreshTokens } from '../../server/db/schema'
import { refreshGraceMs } from '../../server/services/auth.service'
import { refreshCookie, register } from './auth-helpers'
import { buildTestApp, createTestDatabase } from './helpers'

let database: TestDatabase
let app: Express

beforeAll(async () => {
  database = await createTestDatabase()
  app = buildTestApp(database)
})
afterAll(async () => {
  await database.drop()
})

const refresh = (cookie: string) => request(app).post('/api/v1/auth/refresh').set('Cookie', cookie)
const reuses = async (userId: string) => (await database.db.select().from(auditLog).where(and(eq(auditLog.subjectId, userId), eq(auditLog.action, 'auth.refresh_reused')))).length

/** Moves the moment a token was used back in time, as if the grace had run out. */
async function ageUse(userId: string, ms: number): Promise<void> {
  await database.db.update(refreshTokens).set({ usedAt: new Date(Date.now() - ms) }).where(and(eq(refreshTokens.userId, userId), isNotNull(refreshTokens.usedAt)))
}

describe('pOST /api/v1/auth/refresh from several tabs at once', () => {
  it('gives every tab a session when they present the same cookie together', async () => {
    const account = await register(app, 'Tabitha')
    const answers = await Promise.all(Array.from({ length: 5 }, () => refresh(account.cookie)))
    expect(answers.map(answer => answer.status)).toEqual([200, 200, 200, 200, 200])
    expect(await reuses(account.id)).toBe(0)
    // Whichever cookie a tab kept, the sign-in goes on.
    for (const answer of answers)
      expect((await refresh(refreshCookie(answer))).status).toBe(200)
  })

  it('gives a session again for a just-rotated token whose answer was lost', async () => {
    const account = await register(app, 'Lorcan')
    const lost = await refresh(account.cookie)
    expect(lost.status).toBe(200)
    const again = await refresh(account.cookie)
    expect(again.status).toBe(200)
    expect((await refresh(refreshCookie(again))).status).toBe(200)
    expect((await refresh(refreshCookie(lost))).status).toBe(200)
  })

  it('still treats a presentation after the grace as reuse and ends the whole sign-in', async () => {
    const account = await register(app, 'Ottoline')
    const rotated = await refresh(account.cookie)
    const grace = await refresh(account.cookie)
    await ageUse(account.id, refreshGraceMs + 1_000)
    const late = await refresh(account.cookie)
    expect(late.status).toBe(401)
    expect(await reuses(account.id)).toBe(1)
    expect((await refresh(refreshCookie(rotated))).status).toBe(401)
    expect((await refresh(refreshCookie(grace))).status).toBe(401)
  })

  it('gives nothing for a just-rotated token once the person signed out', async () => {
    const account = await register(app, 'Peregrine')
    const rotated = await refresh(account.cookie)
    expect((await request(app).post('/api/v1/auth/logout').set('Cookie', refreshCookie(rotated))).status).toBe(204)
    expect((await refresh(account.cookie)).status).toBe(401)
  })
})
