import type { SyncService } from '../services/sync.service'
import { Router } from 'express'
import { z } from 'zod'
import { IdSchema } from '../../shared/schemas/primitives'
import { currentUserId } from '../middleware/auth'

const RecordParams = z.object({ teamId: IdSchema, recordId: IdSchema })

/** Offline phones push their outbox and pull the team's changes; every route is signed-in. */
export function syncRoutes(sync: SyncService): Router {
  const router = Router()
  router.post('/sync/push', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await sync.push(currentUserId(req), req.body))
  })
  router.get('/sync/pull', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await sync.pull(currentUserId(req), req.query))
  })
  router.get('/teams/:teamId/records/:recordId/history', async (req, res) => {
    const { teamId, recordId } = RecordParams.parse(req.params)
    res.set('Cache-Control', 'no-store').json({ history: await sync.history(currentUserId(req), teamId, recordId) })
  })
  return router
}
