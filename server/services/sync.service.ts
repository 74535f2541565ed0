import type { Role } from '../../shared/schemas/auth'
import type { HistoryEntry } from '../../shared/schemas/records'
import type { Mutation, MutationResult, PullResponse } from '../../shared/schemas/sync'
import type { Db } from '../db/client'
import type { Touch } from '../sync/derive'
import type { TeamsService } from './teams.service'
import { and, asc, count, eq, gt } from 'drizzle-orm'
import { maxMutationsPerPush, MutationSchema, PullQuerySchema, PushBodySchema } from '../../shared/schemas/sync'
import { retryOnContention } from '../db/retry'
import { recordHistory, records, teamSyncState } from '../db/schema'
import { HttpError, notFoundError } from '../http-error'
import { keepAnswers, storedAnswers } from '../sync/answers'
import { applyMutation, describeIssue } from '../sync/apply'
import { rederive } from '../sync/derive'
import { lockCounter, RecordBatch } from '../sync/store'
import { readerView, sealHistory, sealRecord, visibleRecords } from '../sync/visibility'

export interface SyncHooks {
  /** Runs inside the push transaction just before it commits (tests hold a commit back with it). */
  beforeCommit?: () => Promise<void>
}

const isObject = (value: unknown): value is Record<string, unknown> => typeof value === 'object' && value !== null && !Array.isArray(value)

type Item = { index: number, raw: unknown } & ({ ok: true, m: Mutation } | { ok: false, reason: string })

export function createSyncService(deps: { db: Db, teams: TeamsService, hooks?: SyncHooks }) {
  const { db } = deps

  /** The sender's role in each team the batch names; null for a team they are not in. */
  async function rolesOf(userId: string, items: Item[]): Promise<Map<string, Role | null>> {
    const roles = new Map<string, Role | null>()
    for (const item of items) {
      if (item.ok && !roles.has(item.m.teamId))
        roles.set(item.m.teamId, await deps.teams.roleIn(item.m.teamId, userId).catch((error: unknown) => (error instanceof HttpError && error.status === 404 ? null : Promise.reject(error))))
    }
    return roles
  }

  /** One attempt at a push, in one transaction: rolled back whole if InnoDB picks it as a deadlock victim. */
  async function pushOnce(userId: string, clientId: string, items: Item[], roles: Map<string, Role | null>): Promise<MutationResult[]> {
    return db.transaction(async (tx) => {
      // Each team's counter, locked in a fixed order: a second push to a team waits here until this
      // one commits, so revs commit in the order given and a pull never skips a late commit.
      const counters = new Map<string, number>()
      for (const [teamId, role] of [...roles].sort(([a], [b]) => a.localeCompare(b))) {
        if (role)
          counters.set(teamId, await lockCounter(tx, teamId))
      }
      const nextRev = (teamId: string) => (): number => {
        const rev = counters.get(teamId)! + 1
        counters.set(teamId, rev)
        return rev
      }
      const wellFormed = items.flatMap(item => (item.ok ? [item.m] : []))
      const answered = await storedAnswers(tx, userId, clientId, wellFormed.map(m => m.mutationId))
      const batch = new RecordBatch(tx)
      await batch.preload(wellFormed.filter(m => !answered.has(m.mutationId) && roles.get(m.teamId)).map(m => m.id))

      const touchedByTeam = new Map<string, Map<string, Touch>>()
      const fresh: MutationResult[] = []
      const results: MutationResult[] = []
      for (const item of items) {
        if (!item.ok) {
          const mutationId = isObject(item.raw) && typeof item.raw.mutationId === 'string' ? item.raw.mutationId : `#${item.index}`
          results.push({ mutationId, status: 'rejected', reason: item.reason })
          continue
        }
        const { m } = item
        const earlier = answered.get(m.mutationId)
        if (earlier) {
          results.push(earlier)
          continue
        }
        const role = roles.get(m.teamId)
        let result: MutationResult
        if (!role) {
          // Refused alone, so the phone keeps syncing its other teams.
          result = { mutationId: m.mutationId, status: 'rejected', reason: 'teamId: you are not in this team (any more), so the server cannot take this change.' }
        }
        else {
          const touched = touchedByTeam.get(m.teamId) ?? new Map<string, Touch>()
          touchedByTeam.set(m.teamId, touched)
          result = await applyMutation({ batch, actor: { userId, role }, nextRev: nextRev(m.teamId), touched }, m)
        }
        // The same mutation twice in one batch is answered once.
        answered.set(m.mutationId, result)
        fresh.push(result)
        results.push(result)
      }
      for (const [teamId, touched] of touchedByTeam)
        await rederive(batch, touched, nextRev(teamId))
      await batch.flush()
      await keepAnswers(tx, userId, clientId, fresh)
      for (const [teamId, lastRev] of counters)
        await tx.update(teamSyncState).set({ lastRev }).where(eq(teamSyncState.teamId, teamId))
      await deps.hooks?.beforeCommit?.()
      return results
    }, { isolationLevel: 'read committed' })
  }

  /**
   * The server's copies in conflict answers, as this sender may see them now: sealed at the moment
   * of answering, so a stored answer repeated later (or to someone whose role changed) is too.
   */
  async function sealAnswers(items: Item[], roles: Map<string, Role | null>, results: MutationResult[]): Promise<MutationResult[]> {
    const byMutation = new Map(items.flatMap(item => (item.ok ? [[item.m.mutationId, item.m] as const] : [])))
    const copies = results.flatMap((result, index) => {
      const m = byMutation.get(result.mutationId)
      const role = m && roles.get(m.teamId)
      return result.server && m && role ? [{ index, role, entity: m.entity, data: result.server }] : []
    })
    const sealed = [...results]
    for (const role of new Set(copies.map(copy => copy.role))) {
      const mine = copies.filter(copy => copy.role === role)
      const isSealed = await readerView(db, role, mine)
      mine.forEach((copy, i) => {
        if (isSealed(i))
          sealed[copy.index] = { ...sealed[copy.index]!, server: sealRecord(copy.entity, copy.data) }
      })
    }
    return sealed
  }

  return {
    async push(userId: string, body: unknown): Promise<{ results: MutationResult[] }> {
      const count = isObject(body) && Array.isArray(body.mutations) ? body.mutations.length : 0
      if (count > maxMutationsPerPush)
        throw new HttpError(413, 'batch_too_large', `A push holds at most ${maxMutationsPerPush} mutations; this one held ${count}. Send them in smaller batches.`)
      const { clientId, mutations } = PushBodySchema.parse(body)
      const items: Item[] = mutations.map((raw, index) => {
        const parsed = MutationSchema.safeParse(raw)
        return parsed.success ? { index, raw, ok: true, m: parsed.data } : { index, raw, ok: false, reason: describeIssue(parsed.error) }
      })
      const roles = await rolesOf(userId, items)
      const results = await retryOnContention(() => pushOnce(userId, clientId, items, roles))
      return { results: await sealAnswers(items, roles, results) }
    },

    /**
     * Changes after a cursor, in rev order: one range of the (team, rev) index, so a page costs the
     * same whatever the entities and however many records the team holds.
     */
    async pull(userId: string, query: unknown): Promise<PullResponse> {
      const { teamId, since, limit } = PullQuerySchema.parse(query)
      const role = await deps.teams.roleIn(teamId, userId)
      const rows = await db.select().from(records).where(and(eq(records.teamId, teamId), gt(records.rev, since))).orderBy(asc(records.rev)).limit(limit + 1)
      const page = rows.slice(0, limit)
      const cursor = page.at(-1)?.rev ?? since
      const hasMore = rows.length > limit
      // How many changes wait after this page, for the phone's "n of m": counted on the same
      // (team, rev) index, and only when there is more (a last page waits for none).
      const [left] = hasMore ? await db.select({ n: count() }).from(records).where(and(eq(records.teamId, teamId), gt(records.rev, cursor))) : [{ n: 0 }]
      const sent = await visibleRecords(db, role, page)
      return {
        changes: page.map((row, index) => ({ entity: row.entity, id: row.id, rev: row.rev, op: row.deletedAt ? 'delete' : 'put', data: sent[index]! })),
        cursor,
        hasMore,
        remaining: left?.n ?? 0,
      }
    },

    /** Every history entry of one record, oldest first (phones carry only the latest). */
    async history(userId: string, teamId: string, recordId: string): Promise<HistoryEntry[]> {
      const role = await deps.teams.roleIn(teamId, userId)
      const [record] = await db.select({ id: records.id, entity: records.entity, data: records.data }).from(records).where(and(eq(records.id, recordId), eq(records.teamId, teamId)))
      if (!record)
        throw notFoundError('record')
      const rows = await db.select({ entry: recordHistory.entry }).from(recordHistory).where(eq(recordHistory.recordId, recordId)).orderBy(asc(recordHistory.rev))
      const history = rows.map(row => row.entry)
      const sealed = await readerView(db, role, [record])
      return sealed(0) ? sealHistory(record.entity, history) : history
    },
  }
}

export type SyncService = ReturnType<typeof createSyncService>
