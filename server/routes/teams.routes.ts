import type { Request } from 'express'
import type { createInvitationsService } from '../services/invitations.service'
import type { TeamsService } from '../services/teams.service'
import { Router } from 'express'
import { z } from 'zod'
import { AcceptInvitationBodySchema, IdSchema, InvitationBodySchema, RoleBodySchema, TeamBodySchema } from '../../shared/schemas/auth'
import { currentUserId } from '../middleware/auth'

const TeamParams = z.object({ teamId: IdSchema })
const MemberParams = z.object({ teamId: IdSchema, userId: IdSchema })
const InvitationParams = z.object({ teamId: IdSchema, invitationId: IdSchema })

/** `/me`, `/teams/…` and `/invitations/accept`; every route here sits behind requireAuth. */
export function teamRoutes(teams: TeamsService, invitations: ReturnType<typeof createInvitationsService>): Router {
  const router = Router()
  const actor = (req: Request) => ({ userId: currentUserId(req), ip: req.ip })

  router.get('/me', async (req, res) => {
    const userId = currentUserId(req)
    const [user, memberships] = await Promise.all([teams.userOf(userId), teams.membershipsOf(userId)])
    res.json({ user, memberships })
  })

  router.post('/teams', async (req, res) => {
    res.status(201).json(await teams.create(TeamBodySchema.parse(req.body).name, actor(req)))
  })
  router.get('/teams/:teamId', async (req, res) => {
    res.json(await teams.get(TeamParams.parse(req.params).teamId, currentUserId(req)))
  })
  router.patch('/teams/:teamId', async (req, res) => {
    const { teamId } = TeamParams.parse(req.params)
    res.json(await teams.rename(teamId, TeamBodySchema.parse(req.body).name, actor(req)))
  })

  router.get('/teams/:teamId/members', async (req, res) => {
    res.json({ members: await teams.members(TeamParams.parse(req.params).teamId, currentUserId(req)) })
  })
  router.patch('/teams/:teamId/members/:userId', async (req, res) => {
    const { teamId, userId } = MemberParams.parse(req.params)
    res.json({ members: await teams.changeRole(teamId, userId, RoleBodySchema.parse(req.body).role, actor(req)) })
  })
  router.delete('/teams/:teamId/members/:userId', async (req, res) => {
    const { teamId, userId } = MemberParams.parse(req.params)
    await teams.remove(teamId, userId, actor(req))
    res.status(204).end()
  })

  router.get('/teams/:teamId/invitations', async (req, res) => {
    res.json({ invitations: await invitations.pending(TeamParams.parse(req.params).teamId, currentUserId(req)) })
  })
  router.post('/teams/:teamId/invitations', async (req, res) => {
    const { teamId } = TeamParams.parse(req.params)
    const body = InvitationBodySchema.parse(req.body)
    res.status(201).json({ invitation: await invitations.invite(teamId, body.email, body.role, actor(req)) })
  })
  router.delete('/teams/:teamId/invitations/:invitationId', async (req, res) => {
    const { teamId, invitationId } = InvitationParams.parse(req.params)
    await invitations.revoke(teamId, invitationId, actor(req))
    res.status(204).end()
  })
  router.post('/invitations/accept', async (req, res) => {
    res.json({ membership: await invitations.accept(AcceptInvitationBodySchema.parse(req.body).token, actor(req)) })
  })
  return router
}
