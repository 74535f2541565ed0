import type { ResultsService } from '../services/results.service'
import { Router } from 'express'
import { z } from 'zod'
import { IdSchema } from '../../shared/schemas/primitives'
import { ResultsEmailBodySchema } from '../../shared/schemas/results'
import { currentUserId } from '../middleware/auth'

const RoundParams = z.object({ teamId: IdSchema, roundId: IdSchema })

/** A round's results: the CSV, and the CSV e-mailed to the organisers; every route is signed-in. */
export function resultsRoutes(results: ResultsService): Router {
  const router = Router()
  router.get('/teams/:teamId/rounds/:roundId/results.csv', async (req, res) => {
    const { teamId, roundId } = RoundParams.parse(req.params)
    const { csv, filename } = await results.csv(teamId, roundId, currentUserId(req))
    res.set({ 'Cache-Control': 'no-store', 'Content-Disposition': `attachment; filename="${filename}"` }).type('text/csv; charset=utf-8').send(csv)
  })
  router.post('/teams/:teamId/rounds/:roundId/results/email', async (req, res) => {
    const { teamId, roundId } = RoundParams.parse(req.params)
    const userId = currentUserId(req)
    // Members and viewers are refused before their input is read; a bad address then names `to`.
    const { to } = await results.checkSender(teamId, userId).then(() => ResultsEmailBodySchema.parse(req.body))
    res.status(202).json({ sent: await results.email(teamId, roundId, to, { userId, ip: req.ip }) })
  })
  return router
}
