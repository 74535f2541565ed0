import type { RoundsService } from '../services/rounds.service'
import { Router } from 'express'
import { z } from 'zod'
import { IdSchema } from '../../shared/schemas/primitives'
import { currentUserId } from '../middleware/auth'

const RoundParams = z.object({ teamId: IdSchema, roundId: IdSchema })

/** A team's competition rounds; every route is signed-in. */
export function roundRoutes(rounds: RoundsService): Router {
  const router = Router()
  router.post('/teams/:teamId/rounds/:roundId/sign-off', async (req, res) => {
    const { teamId, roundId } = RoundParams.parse(req.params)
    res.json({ round: await rounds.signOff(teamId, roundId, { userId: currentUserId(req), ip: req.ip }) })
  })
  return router
}
