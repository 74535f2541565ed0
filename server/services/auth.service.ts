import type { User } from '../../shared/schemas/auth'
import type { AccessTokens } from '../auth/tokens'
import type { Db } from '../db/client'
import type { Mailer } from '../mail/mailer'
import { and, eq, gt, isNull } from 'drizzle-orm'
import { v7 as uuidv7 } from 'uuid'
import { hashToken, newToken } from '../auth/one-time'
import { passwordResets, refreshTokens, users } from '../db/schema'
import { HttpError } from '../http-error'
import { audit } from './audit.service'
import { hashPassword, verifyPassword } from './passwords'

export const refreshTtlMs = 30 * 24 * 60 * 60 * 1000
/**
 * How long a used refresh token still works. Two tabs refreshing at once send the same cookie, and
 * a phone that loses the answer in a tunnel sends it again: neither is theft, so within this window
 * the token yields a new one of the same family. Later, it counts as reuse and ends the family.
 */
export const refreshGraceMs = 30_000
const resetTtlMs = 60 * 60 * 1000

export interface Session {
  user: User
  accessToken: string
  refreshToken: string
  refreshExpiresAt: Date
}

interface Context { ip?: string }

const wrongCredentials = (): HttpError => new HttpError(401, 'wrong_credentials', 'Wrong e-mail or password.')
const sessionEnded = (): HttpError => new HttpError(401, 'unauthenticated', 'Your session has ended. Sign in again.')
const isDuplicate = (error: unknown): boolean => (error as { errno?: number, cause?: { errno?: number } })?.errno === 1062 || (error as { cause?: { errno?: number } })?.cause?.errno === 1062

/** Ends every unused reset link of an account: a newer link, or a reset done, supersedes them. */
const expireResets = (tx: Pick<Db, 'update'>, userId: string) => tx.update(passwordResets).set({ expiresAt: new Date() }).where(and(eq(passwordResets.userId, userId), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, new Date())))

/** A hash to verify against when the e-mail is unknown, so both failures take the same time. */
let decoyHash: Promise<string> | undefined

export function createAuthService(deps: { db: Db, tokens: AccessTokens, mailer: Mailer, publicUrl: string }) {
  const { db, tokens } = deps

  async function startSession(user: User, familyId = uuidv7()): Promise<Session> {
    const refreshToken = newToken()
    const refreshExpiresAt = new Date(Date.now() + refreshTtlMs)
    await db.insert(refreshTokens).values({ id: uuidv7(), userId: user.id, familyId, tokenHash: hashToken(refreshToken), expiresAt: refreshExpiresAt })
    return { user, accessToken: await tokens.sign(user.id), refreshToken, refreshExpiresAt }
  }

  const revokeFamily = (familyId: string) => db.update(refreshTokens).set({ revokedAt: new Date() }).where(and(eq(refreshTokens.familyId, familyId), isNull(refreshTokens.revokedAt)))

  return {
    async register(body: { email: string, password: string, name: string }, ctx: Context): Promise<Session> {
      const user = { id: uuidv7(), email: body.email, name: body.name }
      try {
        await db.insert(users).values({ ...user, passwordHash: await hashPassword(body.password) })
      }
      catch (error) {
        if (isDuplicate(error))
          throw new HttpError(409, 'email_taken', 'An account with this e-mail address already exists. Sign in instead.')
        throw error
      }
      await audit(db, { action: 'auth.registered', actorId: user.id, subjectId: user.id, ip: ctx.ip })
      return startSession(user)
    },

    async login(body: { email: string, password: string }, ctx: Context): Promise<Session> {
      const [row] = await db.select().from(users).where(eq(users.email, body.email)).limit(1)
      if (!row) {
        decoyHash ??= hashPassword(newToken())
        await verifyPassword(await decoyHash, body.password)
        await audit(db, { action: 'auth.login_failed', detail: { reason: 'unknown_email' }, ip: ctx.ip })
        throw wrongCredentials()
      }
      if (!(await verifyPassword(row.passwordHash, body.password))) {
        await audit(db, { action: 'auth.login_failed', subjectId: row.id, detail: { reason: 'wrong_password' }, ip: ctx.ip })
        throw wrongCredentials()
      }
      await audit(db, { action: 'auth.signed_in', actorId: row.id, subjectId: row.id, ip: ctx.ip })
      return startSession({ id: row.id, email: row.email, name: row.name })
    },

    /** Throws 401 when the account a valid access token names has been deleted since it was issued. */
    async assertAccount(userId: string): Promise<void> {
      const [row] = await db.select({ id: users.id }).from(users).where(eq(users.id, userId)).limit(1)
      if (!row)
        throw new HttpError(401, 'unauthenticated', 'This account no longer exists. Sign in again.')
    },

    /** Rotates: the presented token is used up and the next one of its family is issued. */
    async refresh(presented: string | undefined, ctx: Context): Promise<Session> {
      if (!presented)
        throw sessionEnded()
      const outcome = await db.transaction(async (tx) => {
        const [token] = await tx.select().from(refreshTokens).where(eq(refreshTokens.tokenHash, hashToken(presented))).for('update')
        if (!token || token.revokedAt || token.expiresAt.getTime() <= Date.now())
          return { kind: 'ended' as const }
        if (token.usedAt && Date.now() - token.usedAt.getTime() > refreshGraceMs)
          return { kind: 'reused' as const, token }
        // Within the grace a used token gets another token of its family: see refreshGraceMs.
        if (!token.usedAt)
          await tx.update(refreshTokens).set({ usedAt: new Date() }).where(eq(refreshTokens.id, token.id))
        const [user] = await tx.select({ id: users.id, email: users.email, name: users.name }).from(users).where(eq(users.id, token.userId))
        return user ? { kind: 'rotated' as const, token, user } : { kind: 'ended' as const }
      })
      if (outcome.kind === 'ended')
        throw sessionEnded()
      if (outcome.kind === 'reused') {
        // A used token came back: someone holds a copy. End every session of that sign-in.
        await revokeFamily(outcome.token.familyId)
        await audit(db, { action: 'auth.refresh_reused', subjectId: outcome.token.userId, detail: { familyId: outcome.token.familyId }, ip: ctx.ip })
        throw sessionEnded()
      }
      return startSession(outcome.user, outcome.token.familyId)
    },

    async logout(presented: string | undefined, ctx: Context): Promise<void> {
      if (!presented)
        return
      const [token] = await db.select().from(refreshTokens).where(eq(refreshTokens.tokenHash, hashToken(presented)))
      if (!token)
        return
      await revokeFamily(token.familyId)
      await audit(db, { action: 'auth.signed_out', actorId: token.userId, subjectId: token.userId, ip: ctx.ip })
    },

    /**
     * Mails a one-time link to a known address and makes every older link of that account useless.
     * The route answers before calling it, so nobody can learn from the answer or its timing which
     * addresses have accounts.
     */
    async requestReset(email: string, ctx: Context): Promise<void> {
      const [user] = await db.select({ id: users.id, email: users.email, name: users.name }).from(users).where(eq(users.email, email)).limit(1)
      if (!user) {
        await audit(db, { action: 'password_reset.requested', detail: { known: false }, ip: ctx.ip })
        return
      }
      const token = newToken()
      await db.transaction(async (tx) => {
        // The account's row serialises two requests, so only the newest link stays valid.
        await tx.select({ id: users.id }).from(users).where(eq(users.id, user.id)).for('update')
        await expireResets(tx, user.id)
        await tx.insert(passwordResets).values({ id: uuidv7(), userId: user.id, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + resetTtlMs) })
        await audit(tx, { action: 'password_reset.requested', subjectId: user.id, detail: { known: true }, ip: ctx.ip })
      })
      const link = new URL(`/reset-password?token=${token}`, deps.publicUrl).toString()
      await deps.mailer.send({
        to: user.email,
        subject: 'Reset your Lixivia password',
        text: `Hello ${user.name},\n\nSomeone asked to reset the password of your Lixivia account. If it was you, open this link within an hour:\n\n${link}\n\nIf it was not, ignore this message; your password stays as it is.\n`,
      }).catch(async (error: unknown) => {
        await audit(db, { action: 'password_reset.mail_failed', subjectId: user.id, detail: { message: (error as Error).message }, ip: ctx.ip })
      })
    },

    async confirmReset(body: { token: string, password: string }, ctx: Context): Promise<void> {
      const tokenHash = hashToken(body.token)
      const valid = and(eq(passwordResets.tokenHash, tokenHash), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, new Date()))
      const userId = await db.transaction(async (tx) => {
        const [found] = await tx.select({ userId: passwordResets.userId }).from(passwordResets).where(valid)
        if (!found)
          return undefined
        // The account's row first, as requestReset locks it, then the link again: it may have been used meanwhile.
        const [user] = await tx.select({ email: users.email }).from(users).where(eq(users.id, found.userId)).for('update')
        const [reset] = await tx.select().from(passwordResets).where(valid).for('update')
        if (!user || !reset)
          return undefined
        if (body.password.trim().toLowerCase() === user.email)
          throw new HttpError(400, 'invalid_input', 'password: must not be the same as the e-mail address')
        await tx.update(users).set({ passwordHash: await hashPassword(body.password), updatedAt: new Date() }).where(eq(users.id, reset.userId))
        await tx.update(passwordResets).set({ usedAt: new Date() }).where(eq(passwordResets.id, reset.id))
        await expireResets(tx, reset.userId)
        // A new password ends every session: whoever knew the old one is signed out.
        await tx.update(refreshTokens).set({ revokedAt: new Date() }).where(and(eq(refreshTokens.userId, reset.userId), isNull(refreshTokens.revokedAt)))
        return reset.userId
      })
      if (!userId)
        throw new HttpError(400, 'invalid_token', 'This reset link has expired or was already used. Ask for a new one.')
      await audit(db, { action: 'password_reset.completed', actorId: userId, subjectId: userId, ip: ctx.ip })
    },
  }
}

export type AuthService = ReturnType<typeof createAuthService>
