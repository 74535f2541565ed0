import type { RequestHandler } from 'express'
import type { ApiErrorBody } from '../../shared/schemas/api-error'
import { rateLimit } from 'express-rate-limit'

export interface Limit { limit: number, windowMs: number }
export interface RateLimits { register: Limit, login: Limit, reset: Limit }

/** Per address: enough for a crew at one venue, too few for guessing passwords. */
export const defaultRateLimits: RateLimits = {
  register: { limit: 20, windowMs: 60 * 60 * 1000 },
  login: { limit: 30, windowMs: 15 * 60 * 1000 },
  reset: { limit: 10, windowMs: 15 * 60 * 1000 },
}

/** A limiter answering 429 in the JSON error shape; express-rate-limit sets Retry-After. */
export function limiter(limit: Limit): RequestHandler {
  return rateLimit({
    ...limit,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    // Whose X-Forwarded-For counts is decided on purpose (TRUST_PROXY): a forged one is ignored, not a fault.
    validate: { xForwardedForHeader: false },
    handler: (_req, res) => {
      const body: ApiErrorBody = { error: { code: 'rate_limited', message: 'Too many attempts from this device. Wait a few minutes and try again.' } }
      res.status(429).json(body)
    },
  })
}
