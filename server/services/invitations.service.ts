import type { Invitation, Membership, Role } from '../../shared/schemas/auth'
import type { Db } from '../db/client'
import type { Mailer } from '../mail/mailer'
import type { TeamsService } from './teams.service'
import { and, asc, eq, gt, isNull } from 'drizzle-orm'
import { v7 as uuidv7 } from 'uuid'
import { can } from '../../shared/records/rules'
import { hashToken, newToken } from '../auth/one-time'
import { invitations, memberships, teams, users } from '../db/schema'
import { HttpError, notFoundError } from '../http-error'
import { audit } from './audit.service'
import { forbidden } from './teams.service'

const invitationTtlMs = 7 * 24 * 60 * 60 * 1000

interface Actor { userId: string, ip?: string }

function toInvitation(row: typeof invitations.$inferSelect): Invitation {
  return {
    id: row.id,
    email: row.email,
    role: row.role,
    expiresAt: row.expiresAt.toISOString(),
    createdAt: row.createdAt.toISOString(),
  }
}

export function createInvitationsService(deps: { db: Db, teams: TeamsService, mailer: Mailer, publicUrl: string }) {
  const { db, teams: teamsService } = deps

  return {
    async invite(teamId: string, email: string, role: Role, actor: Actor): Promise<Invitation> {
      const actorRole = await teamsService.roleIn(teamId, actor.userId)
      if (!can.invite(actorRole, role))
        throw forbidden(actorRole === 'lead' ? 'A lead can invite members and viewers; ask an owner for other roles.' : 'Only owners and leads can invite people.')
      const [existing] = await db.select({ id: users.id }).from(memberships).innerJoin(users, eq(users.id, memberships.userId)).where(and(eq(memberships.teamId, teamId), eq(users.email, email)))
      if (existing)
        throw new HttpError(409, 'already_member', 'This person is already in the team.')
      const [team] = await db.select({ name: teams.name }).from(teams).where(eq(teams.id, teamId))
      const [inviter] = await db.select({ name: users.name }).from(users).where(eq(users.id, actor.userId))
      const token = newToken()
      const row = { id: uuidv7(), teamId, email, role, tokenHash: hashToken(token), invitedBy: actor.userId, expiresAt: new Date(Date.now() + invitationTtlMs), createdAt: new Date() }
      await db.insert(invitations).values(row)
      await audit(db, { action: 'invitation.created', actorId: actor.userId, teamId, subjectId: row.id, detail: { email, role }, ip: actor.ip })
      const link = new URL(`/join?token=${token}`, deps.publicUrl).toString()
      await deps.mailer.send({
        to: email,
        subject: `${inviter?.name ?? 'A colleague'} invites you to ${team?.name ?? 'a team'} on Lixivia`,
        text: `${inviter?.name ?? 'A colleague'} invites you to join "${team?.name}" on Lixivia as ${role}.\n\nOpen this link within seven days, then sign in or create an account with this e-mail address (${email}):\n\n${link}\n\nIf you did not expect this, ignore the message.\n`,
      })
      return toInvitation({ ...row, acceptedAt: null, acceptedBy: null, revokedAt: null })
    },

    async pending(teamId: string, userId: string): Promise<Invitation[]> {
      if (!can.seeInvitations(await teamsService.roleIn(teamId, userId)))
        throw forbidden('Only owners and leads can see invitations.')
      const rows = await db.select().from(invitations).where(and(eq(invitations.teamId, teamId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, new Date()))).orderBy(asc(invitations.createdAt))
      return rows.map(toInvitation)
    },

    async revoke(teamId: string, invitationId: string, actor: Actor): Promise<void> {
      if (!can.seeInvitations(await teamsService.roleIn(teamId, actor.userId)))
        throw forbidden('Only owners and leads can withdraw invitations.')
      const result = await db.update(invitations).set({ revokedAt: new Date() }).where(and(eq(invitations.id, invitationId), eq(invitations.teamId, teamId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
      if (result[0].affectedRows === 0)
        throw notFoundError('invitation')
      await audit(db, { action: 'invitation.revoked', actorId: actor.userId, teamId, subjectId: invitationId, ip: actor.ip })
    },

    /** The signed-in invitee joins; the link works once, before it expires, for its own address. */
    async accept(token: string, actor: Actor): Promise<Membership> {
      const membership = await db.transaction(async (tx) => {
        const [invitation] = await tx.select().from(invitations).where(eq(invitations.tokenHash, hashToken(token))).for('update')
        if (!invitation)
          throw new HttpError(404, 'invalid_invitation', 'This invitation link is not valid. Ask for a new one.')
        if (invitation.acceptedAt)
          throw new HttpError(410, 'invitation_used', 'This invitation has already been used.')
        if (invitation.revokedAt)
          throw new HttpError(410, 'invitation_revoked', 'This invitation was withdrawn. Ask for a new one.')
        if (invitation.expiresAt.getTime() <= Date.now())
          throw new HttpError(410, 'invitation_expired', 'This invitation has expired. Ask for a new one.')
        const [user] = await tx.select({ email: users.email }).from(users).where(eq(users.id, actor.userId))
        if (user?.email !== invitation.email)
          throw new HttpError(403, 'invitation_for_someone_else', `This invitation was sent to another e-mail address. Sign in as ${invitation.email} to accept it.`)
        const [already] = await tx.select({ role: memberships.role }).from(memberships).where(and(eq(memberships.teamId, invitation.teamId), eq(memberships.userId, actor.userId)))
        if (already)
          throw new HttpError(409, 'already_member', 'You are already in this team.')
        await tx.insert(memberships).values({ teamId: invitation.teamId, userId: actor.userId, role: invitation.role })
        await tx.update(invitations).set({ acceptedAt: new Date(), acceptedBy: actor.userId }).where(eq(invitations.id, invitation.id))
        await audit(tx, { action: 'invitation.accepted', actorId: actor.userId, teamId: invitation.teamId, subjectId: invitation.id, detail: { role: invitation.role }, ip: actor.ip })
        const [team] = await tx.select({ name: teams.name }).from(teams).where(eq(teams.id, invitation.teamId))
        return { teamId: invitation.teamId, teamName: team?.name ?? '', role: invitation.role }
      })
      return membership
    },
  }
}
