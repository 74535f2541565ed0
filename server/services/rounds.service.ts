import type { Db } from '../db/client'
import type { TeamsService } from './teams.service'
import { and, eq, isNull } from 'drizzle-orm'
import { can } from '../../shared/records/rules'
import { retryOnContention } from '../db/retry'
import { records, teamSyncState } from '../db/schema'
import { HttpError, notFoundError } from '../http-error'
import { freezeRound } from '../sync/judging'
import { lockCounter, RecordBatch, toRecord } from '../sync/store'

/** Competition rounds: what the sync layer does not do on its own (signing one off). */
export function createRoundsService(deps: { db: Db, teams: TeamsService }) {
  const { db } = deps

  return {
    /**
     * A lead or owner freezes a round: from then on every change to it, its cups, their brews and
     * readings is refused (shared/records/rules.ts). Signing a signed-off round again changes nothing.
     */
    async signOff(teamId: string, roundId: string, actor: { userId: string, ip?: string }): Promise<Record<string, unknown>> {
      const role = await deps.teams.roleIn(teamId, actor.userId)
      if (!can.signOff(role))
        throw new HttpError(403, 'forbidden', 'Only a lead or an owner can sign off a round.')
      return retryOnContention(() => db.transaction(async (tx) => {
        const lastRev = await lockCounter(tx, teamId)
        const batch = new RecordBatch(tx)
        await batch.preload([roundId])
        const round = await batch.find('round', roundId)
        if (!round || round.teamId !== teamId || round.deletedAt)
          throw notFoundError('round')
        if (round.derived)
          return toRecord(round)
        let rev = lastRev
        const signed = await freezeRound(batch, round, { userId: actor.userId, ip: actor.ip, via: 'route' }, () => ++rev)
        await batch.flush()
        await tx.update(teamSyncState).set({ lastRev: rev }).where(eq(teamSyncState.teamId, teamId))
        return toRecord(signed)
      }, { isolationLevel: 'read committed' }))
    },

    /** Whether a round of the team exists (for routes that hang off a round). */
    async exists(teamId: string, roundId: string): Promise<boolean> {
      const [row] = await db.select({ id: records.id }).from(records).where(and(eq(records.id, roundId), eq(records.teamId, teamId), eq(records.entity, 'round'), isNull(records.deletedAt)))
      return Boolean(row)
    },
  }
}

export type RoundsService = ReturnType<typeof createRoundsService>
