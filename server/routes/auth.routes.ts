import type { CookieOptions, Request, RequestHandler, Response } from 'express'
import type { AuthService, Session } from '../services/auth.service'
import { Router } from 'express'
import { LoginBodySchema, RegisterBodySchema, ResetConfirmBodySchema, ResetRequestBodySchema } from '../../shared/schemas/auth'
import { isLoopback } from '../loopback'
import { refreshTtlMs } from '../services/auth.service'

export const refreshCookieName = 'lixivia_refresh'
export const refreshCookiePath = '/api/v1/auth'

/**
 * httpOnly, SameSite=Strict, only sent to the auth routes; Secure everywhere but loopback, and
 * always in production (where the app sits behind HTTPS).
 */
function cookieOptionsOf(req: Request, secureCookies: boolean): CookieOptions {
  return { httpOnly: true, sameSite: 'strict', path: refreshCookiePath, secure: secureCookies || req.secure || !isLoopback(req.hostname) }
}

export interface AuthLimits { register: RequestHandler, login: RequestHandler, reset: RequestHandler }

export function authRoutes(auth: AuthService, limits: AuthLimits, options: { secureCookies: boolean }): Router {
  const router = Router()
  const cookieOptions = (req: Request): CookieOptions => cookieOptionsOf(req, options.secureCookies)
  const sendSession = (req: Request, res: Response, session: Session, status: number): void => {
    res.cookie(refreshCookieName, session.refreshToken, { ...cookieOptions(req), maxAge: refreshTtlMs })
    res.status(status).json({ user: session.user, accessToken: session.accessToken })
  }
  const ctx = (req: Request) => ({ ip: req.ip })
  const presented = (req: Request): string | undefined => (req.cookies as Record<string, string> | undefined)?.[refreshCookieName]

  router.post('/auth/register', limits.register, async (req, res) => {
    sendSession(req, res, await auth.register(RegisterBodySchema.parse(req.body), ctx(req)), 201)
  })
  router.post('/auth/login', limits.login, async (req, res) => {
    sendSession(req, res, await auth.login(LoginBodySchema.parse(req.body), ctx(req)), 200)
  })
  router.post('/auth/refresh', async (req, res) => {
    try {
      sendSession(req, res, await auth.refresh(presented(req), ctx(req)), 200)
    }
    catch (error) {
      res.clearCookie(refreshCookieName, cookieOptions(req))
      throw error
    }
  })
  router.post('/auth/logout', async (req, res) => {
    await auth.logout(presented(req), ctx(req))
    res.clearCookie(refreshCookieName, cookieOptions(req))
    res.status(204).end()
  })
  router.post('/auth/password-reset/request', limits.reset, (req, res) => {
    const { email } = ResetRequestBodySchema.parse(req.body)
    res.status(202).json({ status: 'sent-if-known' })
    // The look-up, the link and the mail come after the answer, which is the same for every address.
    auth.requestReset(email, ctx(req)).catch((error: unknown) => req.log.error({ err: error }, 'password reset request failed'))
  })
  router.post('/auth/password-reset/confirm', limits.reset, async (req, res) => {
    await auth.confirmReset(ResetConfirmBodySchema.parse(req.body), ctx(req))
    res.status(204).end()
  })
  return router
}
