import type { RequestHandler } from 'express'
import type { AccessTokens } from '../auth/tokens'
import { HttpError } from '../http-error'

declare module 'express-serve-static-core' {
  interface Request {
    /** Set by requireAuth: the signed-in user. */
    userId?: string
  }
}

/** Demands `Authorization: Bearer <access token>` and sets `req.userId`. */
export function requireAuth(tokens: AccessTokens): RequestHandler {
  return async (req, _res, next) => {
    const header = req.get('authorization') ?? ''
    const match = /^Bearer ([\w-]+\.[\w-]+\.[\w-]*)$/.exec(header)
    if (!match)
      throw new HttpError(401, 'unauthenticated', 'Sign in to do this.')
    req.userId = await tokens.verify(match[1]!)
    next()
  }
}

/** The signed-in user's id; only valid behind requireAuth. */
export function currentUserId(req: { userId?: string }): string {
  if (!req.userId)
    throw new HttpError(401, 'unauthenticated', 'Sign in to do this.')
  return req.userId
}
