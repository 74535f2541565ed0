import type { RequestHandler } from 'express'

/**
 * Every API answer is about a person or a team unless a route says otherwise, so none may sit in
 * the browser's or a proxy's cache, where the next person on a shared phone could read it.
 */
export const noStore: RequestHandler = (_req, res, next) => {
  res.set('Cache-Control', 'no-store')
  next()
}
