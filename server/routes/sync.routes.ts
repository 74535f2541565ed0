import type { SyncService } from '../services/sync.service'
import { Router } from 'express'
import { z } from 'zod'
import { IdSchema } from '../../shared/schemas/auth'
import { currentUserId } from '../middleware/auth'

const RoundParams = z.object({ teamId: IdSchema, roundId: IdSchema })

/** Offline phones push their outbox and pull the team's changes; every route is signed-in. */
export function syncRoutes(sync: SyncService): Router {
  const router = Router()
  router.post('/sync/push', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await sync.push(currentUserId(req), req.body))
  })
  router.get('/sync/pull', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await sync.pull(currentUserId(req), req.query))
  })
  router.post('/teams/:teamId/rounds/:roundId/sign-off', async (req, res) => {
    const { teamId, roundId } = RoundParams.parse(req.params)
    res.json({ round: await sync.signOffRound(teamId, roundId, { userId: currentUserId(req) }) })
  })
  return router
}
