import type { RequestHandler } from 'express'
import type { AccessTokens } from '../auth/tokens'
import type { AuthService } from '../services/auth.service'
import { HttpError } from '../http-error'

declare module 'express-serve-static-core' {
  interface Request {
    /** Set by requireAuth: the signed-in user. */
    userId?: string
  }
}

/**
 * Demands `Authorization: Bearer <access token>` of an account that still exists and sets
 * `req.userId`: a token outlives a deleted account by up to 15 minutes.
 */
export function requireAuth(tokens: AccessTokens, accounts: Pick<AuthService, 'assertAccount'>): RequestHandler {
  return async (req, _res, next) => {
    const header = req.get('authorization') ?? ''
    const match = /^Bearer ([\w-]+\.[\w-]+\.[\w-]*)$/.exec(header)
    if (!match)
      throw new HttpError(401, 'unauthenticated', 'Sign in to do this.')
    const userId = await tokens.verify(match[1]!)
    await accounts.assertAccount(userId)
    req.userId = userId
    next()
  }
}

/** The signed-in user's id; only valid behind requireAuth. */
export function currentUserId(req: { userId?: string }): string {
  if (!req.userId)
    throw new HttpError(401, 'unauthenticated', 'Sign in to do this.')
  return req.userId
}
