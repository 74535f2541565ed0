import type { Member, Membership, Role, TeamResponse } from '../../shared/schemas/auth'
import type { Db } from '../db/client'
import { and, asc, eq, sql } from 'drizzle-orm'
import { v7 as uuidv7 } from 'uuid'
import { can } from '../../shared/records/rules'
import { memberships, teams, teamSyncState, users } from '../db/schema'
import { HttpError, notFoundError } from '../http-error'
import { audit } from './audit.service'

interface Actor { userId: string, ip?: string }

export const forbidden = (message: string): HttpError => new HttpError(403, 'forbidden', message)

const lastOwner = (): HttpError => new HttpError(409, 'last_owner', 'A team must keep at least one owner: make someone else owner first.')

export function createTeamsService(db: Db) {
  /** The caller's role in a team; 404 when they are not in it, so its existence does not leak. */
  async function roleIn(teamId: string, userId: string): Promise<Role> {
    const [row] = await db.select({ role: memberships.role }).from(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)))
    if (!row)
      throw notFoundError('team')
    return row.role
  }

  /** Locks the team's owner rows, so two demotions at once cannot leave it without one. */
  async function otherOwners(tx: Pick<Db, 'select'>, teamId: string, userId: string): Promise<number> {
    const owners = await tx.select({ userId: memberships.userId }).from(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.role, 'owner'))).for('update')
    return owners.filter(owner => owner.userId !== userId).length
  }

  async function teamFor(teamId: string, userId: string): Promise<TeamResponse> {
    const role = await roleIn(teamId, userId)
    const [team] = await db.select().from(teams).where(eq(teams.id, teamId))
    if (!team)
      throw notFoundError('team')
    return { team: { id: team.id, name: team.name, createdAt: team.createdAt.toISOString() }, role }
  }

  async function membersOf(teamId: string, userId: string): Promise<Member[]> {
    await roleIn(teamId, userId)
    const rows = await db.select({ userId: users.id, name: users.name, email: users.email, role: memberships.role, joinedAt: memberships.createdAt })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(eq(memberships.teamId, teamId))
      .orderBy(sql`FIELD(${memberships.role}, 'owner', 'lead', 'member', 'viewer')`, asc(users.name))
    return rows.map(row => ({ ...row, joinedAt: row.joinedAt.toISOString() }))
  }

  return {
    roleIn,

    async userOf(userId: string): Promise<{ id: string, email: string, name: string }> {
      const [user] = await db.select({ id: users.id, email: users.email, name: users.name }).from(users).where(eq(users.id, userId))
      if (!user)
        throw new HttpError(401, 'unauthenticated', 'This account no longer exists. Sign in again.')
      return user
    },

    async membershipsOf(userId: string): Promise<Membership[]> {
      return db.select({ teamId: teams.id, teamName: teams.name, role: memberships.role })
        .from(memberships)
        .innerJoin(teams, eq(teams.id, memberships.teamId))
        .where(eq(memberships.userId, userId))
        .orderBy(asc(teams.name))
    },

    async create(name: string, actor: Actor): Promise<TeamResponse> {
      const id = uuidv7()
      await db.transaction(async (tx) => {
        await tx.insert(teams).values({ id, name })
        await tx.insert(memberships).values({ teamId: id, userId: actor.userId, role: 'owner' })
        // The sync counter comes with the team, so a push only ever locks a row that exists.
        await tx.insert(teamSyncState).values({ teamId: id, lastRev: 0 })
        await audit(tx, { action: 'team.created', actorId: actor.userId, teamId: id, subjectId: id, ip: actor.ip })
      })
      return teamFor(id, actor.userId)
    },

    get: teamFor,

    async rename(teamId: string, name: string, actor: Actor): Promise<TeamResponse> {
      if (!can.editTeam(await roleIn(teamId, actor.userId)))
        throw forbidden('Only an owner can change the team\'s settings.')
      // The new name and its audit row land together or not at all.
      await db.transaction(async (tx) => {
        await tx.update(teams).set({ name, updatedAt: new Date() }).where(eq(teams.id, teamId))
        await audit(tx, { action: 'team.renamed', actorId: actor.userId, teamId, subjectId: teamId, detail: { name }, ip: actor.ip })
      })
      return teamFor(teamId, actor.userId)
    },

    members: membersOf,

    async changeRole(teamId: string, targetId: string, role: Role, actor: Actor): Promise<Member[]> {
      if (!can.manageMembers(await roleIn(teamId, actor.userId)))
        throw forbidden('Only an owner can change roles.')
      await db.transaction(async (tx) => {
        const [target] = await tx.select({ role: memberships.role }).from(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, targetId))).for('update')
        if (!target)
          throw notFoundError('member')
        if (target.role === 'owner' && role !== 'owner' && (await otherOwners(tx, teamId, targetId)) === 0)
          throw lastOwner()
        await tx.update(memberships).set({ role }).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, targetId)))
        await audit(tx, { action: 'member.role_changed', actorId: actor.userId, teamId, subjectId: targetId, detail: { from: target.role, to: role }, ip: actor.ip })
      })
      return membersOf(teamId, actor.userId)
    },

    /** An owner removes anyone; everyone else may only leave. */
    async remove(teamId: string, targetId: string, actor: Actor): Promise<void> {
      const actorRole = await roleIn(teamId, actor.userId)
      if (targetId !== actor.userId && !can.manageMembers(actorRole))
        throw forbidden('Only an owner can remove other members.')
      await db.transaction(async (tx) => {
        const [target] = await tx.select({ role: memberships.role }).from(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, targetId))).for('update')
        if (!target)
          throw notFoundError('member')
        if (target.role === 'owner' && (await otherOwners(tx, teamId, targetId)) === 0)
          throw lastOwner()
        await tx.delete(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, targetId)))
        await audit(tx, { action: targetId === actor.userId ? 'member.left' : 'member.removed', actorId: actor.userId, teamId, subjectId: targetId, detail: { role: target.role }, ip: actor.ip })
      })
    },
  }
}

export type TeamsService = ReturnType<typeof createTeamsService>
