import type { Pool } from 'mysql2/promise'
import type { Health } from '../../shared/schemas/health'
import { Router } from 'express'
import { pingDatabase } from '../db/client'

/** `GET /health`: whether this instance can serve, for people and for load balancers. */
export function healthRoutes(deps: { pool: Pool, version: string }): Router {
  const router = Router()
  router.get('/health', async (_req, res) => {
    const up = await pingDatabase(deps.pool)
    const body: Health = { status: up ? 'ok' : 'unavailable', db: up ? 'up' : 'down', version: deps.version }
    res.status(up ? 200 : 503).set('Cache-Control', 'no-store').json(body)
  })
  return router
}
