import type { z } from 'zod'
import type { Role } from '../../shared/schemas/auth'
import type { Change, EntityName, HistoryEntry, Mutation, MutationResult } from '../../shared/schemas/entities'
import type { Db } from '../db/client'
import type { RecordTable } from '../sync/registry'
import type { TeamsService } from './teams.service'
import { and, asc, eq, gt, inArray, isNull } from 'drizzle-orm'
import { BrewingInputError } from '../../shared/brewing'
import { maxMutationsPerPush, MutationSchema, PullQuerySchema, PushBodySchema } from '../../shared/schemas/entities'
import { readings, rounds, syncMutations, teamSyncState } from '../db/schema'
import { HttpError } from '../http-error'
import { deriveBrew, deriveCalibration } from '../sync/derive'
import { registry } from '../sync/registry'

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]
/** A brew whose result may have moved in this batch: the rev of its own edit (if any), and by whom. */
interface Touch { rev: number | null, by: string }
type Row = RecordTable['$inferSelect'] & { signedOffAt?: Date | null }

const entityNames = Object.keys(registry) as EntityName[]
const iso = (date: Date | null | undefined): string | null => (date ? date.toISOString() : null)
const isObject = (value: unknown): value is Record<string, unknown> => typeof value === 'object' && value !== null && !Array.isArray(value)
const same = (a: unknown, b: unknown): boolean => JSON.stringify(a ?? null) === JSON.stringify(b ?? null)

/** A brew's result as its history shows it. */
const pick = (derived: Record<string, unknown> | null | undefined) => ({ tdsPercent: derived?.tdsPercent ?? null, yieldPercent: derived?.yieldPercent ?? null })

/** Adds changes to the history entry of that rev, or appends a new entry. */
function withChanges(history: HistoryEntry[], entry: HistoryEntry): HistoryEntry[] {
  const last = history.at(-1)
  if (last?.rev === entry.rev)
    return [...history.slice(0, -1), { ...last, changes: { ...last.changes, ...entry.changes } }]
  return [...history, entry]
}

function describe(error: z.ZodError): string {
  const issue = error.issues[0]
  return issue ? `${issue.path.join('.') || 'mutation'}: ${issue.message}` : 'The mutation is not valid.'
}

/** What phones receive: the envelope, the data, and what the server derived from it. */
export function toRecord(row: Row): Record<string, unknown> {
  return {
    ...row.data,
    id: row.id,
    teamId: row.teamId,
    createdBy: row.createdBy,
    createdAt: iso(row.createdAt),
    updatedAt: iso(row.updatedAt),
    rev: row.rev,
    deletedAt: iso(row.deletedAt),
    derived: row.derived ?? null,
    history: row.history ?? [],
    ...('signedOffAt' in row ? { signedOffAt: iso(row.signedOffAt) } : {}),
  }
}

export interface SyncHooks {
  /** Runs inside the push transaction just before it commits (tests hold a commit back with it). */
  beforeCommit?: () => Promise<void>
}

export function createSyncService(deps: { db: Db, teams: TeamsService, hooks?: SyncHooks }) {
  const { db } = deps

  /** Locks the team's counter row until the transaction ends, and returns its last rev. */
  async function lockCounter(tx: Tx, teamId: string): Promise<number> {
    await tx.insert(teamSyncState).ignore().values({ teamId, lastRev: 0 })
    const [state] = await tx.select().from(teamSyncState).where(eq(teamSyncState.teamId, teamId)).for('update')
    return state!.lastRev
  }

  /**
   * One push's view of the records: rows read once (locked) and cached, new rows buffered and
   * written together at the end, so a batch costs a few queries instead of several per mutation.
   */
  interface Batch {
    tx: Tx
    rows: Map<string, Row>
    inserts: Map<string, { entity: EntityName, row: Row }>
  }
  const key = (entity: EntityName, id: string): string => `${entity}:${id}`

  async function find(batch: Batch, entity: EntityName, id: string): Promise<Row | undefined> {
    const cached = batch.rows.get(key(entity, id))
    if (cached || batch.rows.has(key(entity, id)))
      return cached
    const table = registry[entity].table
    const [row] = await batch.tx.select().from(table).where(eq(table.id, id))
    batch.rows.set(key(entity, id), row as Row | undefined as Row)
    return row as Row | undefined
  }

  /** Reads and locks every record the batch touches, one query per entity. */
  async function preload(batch: Batch, mutations: Mutation[]): Promise<void> {
    const ids = new Map<EntityName, Set<string>>()
    for (const m of mutations)
      ids.set(m.entity, (ids.get(m.entity) ?? new Set()).add(m.id))
    for (const [entity, set] of ids) {
      const table = registry[entity].table
      const found = await batch.tx.select().from(table).where(inArray(table.id, [...set])).for('update')
      const byId = new Map(found.map(row => [row.id, row as Row]))
      for (const id of set)
        batch.rows.set(key(entity, id), byId.get(id) as Row)
    }
  }

  async function roundSignedOff(batch: Batch, roundId: unknown): Promise<boolean> {
    if (typeof roundId !== 'string')
      return false
    return Boolean((await find(batch, 'round', roundId))?.signedOffAt)
  }

  /** A record inside a signed-off round (the round, its entries, their brews and readings) is frozen. */
  async function frozenReason(batch: Batch, entity: EntityName, id: string, data: Record<string, unknown>): Promise<string | null> {
    const reason = 'This round is signed off: its results can no longer change. Ask the head judge if a correction is needed.'
    let roundId: unknown = null
    if (entity === 'round') {
      roundId = id
    }
    else if (entity === 'entry') {
      roundId = data.roundId
    }
    else if (entity === 'brew' || entity === 'reading') {
      const brew = entity === 'brew' ? { data } : await find(batch, 'brew', data.brewId as string)
      const context = brew?.data.context as { kind?: string, refId?: string } | undefined
      if (context?.kind === 'entry' && context.refId)
        roundId = (await find(batch, 'entry', context.refId))?.data.roundId
    }
    return (await roundSignedOff(batch, roundId)) ? reason : null
  }

  async function apply(batch: Batch, m: Mutation, role: Role, userId: string, nextRev: () => number, touched: Map<string, Touch>): Promise<MutationResult> {
    const definition = registry[m.entity]
    const rejected = (reason: string): MutationResult => ({ mutationId: m.mutationId, status: 'rejected', reason })
    const applied = (rev: number): MutationResult => ({ mutationId: m.mutationId, status: 'applied', rev })
    if (role === 'viewer')
      return rejected('Viewers can read the team\'s records but not change them.')

    const current = await find(batch, m.entity, m.id)
    if (current && current.teamId !== m.teamId)
      return rejected('This record belongs to another team.')
    if (current && role === 'member' && current.createdBy !== userId)
      return rejected('Members can change only the records they made; ask a lead to correct this one.')
    const conflict = (): MutationResult => ({ mutationId: m.mutationId, status: 'conflict', rev: current!.rev, server: toRecord(current!) })

    // A teammate's brew is corrected only with a reason, which its history keeps.
    if (current && m.entity === 'brew' && current.createdBy !== userId && !m.reason && (m.op !== 'put' || current.deletedAt === null))
      return rejected('reason: say why you change a brew a teammate recorded; the reason stays in its history.')
    const note = (op: HistoryEntry['op'], rev: number, changes: HistoryEntry['changes'] = {}): HistoryEntry[] =>
      [...(current?.history ?? []), { rev, at: new Date().toISOString(), by: userId, op, changes, ...(m.reason ? { reason: m.reason } : {}) }]

    if (m.op === 'delete' || m.op === 'restore') {
      if (!current)
        return rejected('There is no such record on the server.')
      if (definition.appendOnly)
        return rejected('Readings are kept as recorded and cannot be deleted.')
      if (Boolean(current.deletedAt) === (m.op === 'delete'))
        return applied(current.rev)
      if (m.op === 'delete' && m.baseRev !== null && current.rev > m.baseRev)
        return conflict()
      const frozen = await frozenReason(batch, m.entity, m.id, current.data)
      if (frozen)
        return rejected(frozen)
      const rev = nextRev()
      await write(batch, m.entity, { ...current, deletedAt: m.op === 'delete' ? new Date() : null, updatedAt: new Date(), rev, history: note(m.op, rev) })
      return applied(rev)
    }

    if (!isObject(m.data))
      return rejected('data: a put needs the record\'s fields.')
    if (current?.deletedAt)
      return conflict()
    // An edit sends only the fields it changed; they are checked together with the server's copy.
    const parsed = definition.schema.safeParse(current ? { ...current.data, ...m.data } : m.data)
    if (!parsed.success)
      return rejected(describe(parsed.error))
    const data = parsed.data
    const changed = current ? Object.keys(m.data).filter(key => !same(data[key], current.data[key])) : Object.keys(data)
    if (current) {
      if (changed.length === 0)
        return applied(current.rev)
      if (definition.appendOnly)
        return rejected('Readings cannot be changed once recorded; add a new reading instead.')
      // Edits of different fields merge; a field changed on the server since the phone's copy clashes.
      if (m.baseRev === null || changed.some(key => (current.fieldRevs[key] ?? 0) > (m.baseRev as number)))
        return conflict()
    }
    for (const [entity, parentId] of definition.parents(data)) {
      const parent = await find(batch, entity, parentId)
      if (!parent || parent.teamId !== m.teamId || parent.deletedAt)
        return rejected(`The ${entity} this record belongs to is not on the server.`)
    }
    const frozen = await frozenReason(batch, m.entity, m.id, data)
    if (frozen)
      return rejected(frozen)

    let derived: Record<string, unknown> | null = current?.derived ?? null
    if (m.entity === 'calibration') {
      try {
        derived = deriveCalibration(data)
      }
      catch (error) {
        if (error instanceof BrewingInputError)
          return rejected(`points: ${error.message}`)
        throw error
      }
    }
    const rev = nextRev()
    const fieldRevs = { ...current?.fieldRevs, ...Object.fromEntries(changed.map(key => [key, rev])) }
    const columns = { data, derived, fieldRevs, rev, updatedAt: new Date(), ...definition.references(data) }
    const now = new Date()
    if (current)
      await write(batch, m.entity, { ...current, ...columns, history: note('edit', rev, Object.fromEntries(changed.map(key => [key, { from: current.data[key] ?? null, to: data[key] ?? null }]))) })
    else
      await write(batch, m.entity, { id: m.id, teamId: m.teamId, createdBy: userId, createdAt: now, deletedAt: null, history: null, ...columns } as Row)
    if (m.entity === 'brew')
      touched.set(m.id, { ...touched.get(m.id), rev, by: userId })
    else if (m.entity === 'reading')
      touched.set(data.brewId as string, { rev: null, by: userId, ...touched.get(data.brewId as string) })
    return applied(rev)
  }

  /** A changed or new row: new ones wait in the batch's buffer, existing ones are updated now. */
  async function write(batch: Batch, entity: EntityName, row: Row): Promise<void> {
    const k = key(entity, row.id)
    const existed = batch.rows.get(k) && !batch.inserts.has(k)
    batch.rows.set(k, row)
    if (!existed) {
      batch.inserts.set(k, { entity, row })
      return
    }
    const { id, teamId: _team, createdBy: _by, createdAt: _at, ...changes } = row
    const table = registry[entity].table
    await batch.tx.update(table).set(changes).where(eq(table.id, id))
  }

  /** Writes the buffered new rows, one multi-row INSERT per table and 500 rows at most each. */
  async function flush(batch: Batch): Promise<void> {
    const byEntity = new Map<EntityName, Row[]>()
    for (const { entity, row } of batch.inserts.values())
      byEntity.set(entity, [...(byEntity.get(entity) ?? []), row])
    for (const [entity, rows] of byEntity) {
      for (let i = 0; i < rows.length; i += 500)
        await batch.tx.insert(registry[entity].table).values(rows.slice(i, i + 500))
    }
    batch.inserts.clear()
  }

  /**
   * Recomputes the strength and yield of the brews a batch touched, from all their readings but the
   * ones set aside (one query for those already stored). A changed result of a stored brew is a new
   * rev, and its history says how the result moved and how many readings came.
   */
  async function rederive(batch: Batch, touched: Map<string, Touch>, nextRev: () => number): Promise<void> {
    if (touched.size === 0)
      return
    const brewIds = [...touched.keys()]
    const found = new Map<string, { id: string, value: number, fresh: boolean }[]>(brewIds.map(id => [id, []]))
    const stored = await batch.tx.select({ id: readings.id, brewId: readings.brewId, data: readings.data }).from(readings).where(and(inArray(readings.brewId, brewIds), isNull(readings.deletedAt)))
    const seen = new Set<string>()
    for (const reading of stored) {
      seen.add(reading.id)
      found.get(reading.brewId!)?.push({ id: reading.id, value: reading.data.value as number, fresh: false })
    }
    for (const { entity, row } of batch.inserts.values()) {
      if (entity === 'reading' && !seen.has(row.id))
        found.get(row.data.brewId as string)?.push({ id: row.id, value: row.data.value as number, fresh: true })
    }
    for (const [brewId, touch] of touched) {
      const brew = await find(batch, 'brew', brewId)
      if (!brew)
        continue
      let calibration = null
      if (typeof brew.data.calibrationId === 'string') {
        const row = await find(batch, 'calibration', brew.data.calibrationId)
        const fit = (row?.derived as { fit?: unknown } | null)?.fit
        if (row && fit)
          calibration = { fit: fit as never, standardUnit: row.data.standardUnit as 'brix' | 'tds' }
      }
      const all = found.get(brewId) ?? []
      const excluded = new Set(brew.data.excludedReadingIds as string[] | undefined)
      const derived = deriveBrew(brew.data, all.filter(r => !excluded.has(r.id)).map(r => r.value), calibration)
      if (same(derived, brew.derived))
        continue
      const rev = touch.rev ?? nextRev()
      const isNew = batch.inserts.has(key('brew', brewId))
      const added = all.filter(r => r.fresh).length
      const changes: HistoryEntry['changes'] = {
        result: { from: pick(brew.derived), to: pick(derived) },
        ...(added ? { readings: { from: all.length - added, to: all.length } } : {}),
      }
      const history = isNew ? brew.history : withChanges(brew.history ?? [], { rev, at: new Date().toISOString(), by: touch.by, op: 'edit', changes })
      await write(batch, 'brew', { ...brew, derived, history, rev, updatedAt: new Date() })
    }
  }

  return {
    async push(userId: string, body: unknown): Promise<{ results: MutationResult[] }> {
      const count = isObject(body) && Array.isArray(body.mutations) ? body.mutations.length : 0
      if (count > maxMutationsPerPush)
        throw new HttpError(413, 'batch_too_large', `A push holds at most ${maxMutationsPerPush} mutations; this one held ${count}. Send them in smaller batches.`)
      const { clientId, mutations } = PushBodySchema.parse(body)
      const items = mutations.map((raw, index) => ({ raw, index, parsed: MutationSchema.safeParse(raw) }))
      const roles = new Map<string, Role>()
      for (const item of items) {
        if (item.parsed.success && !roles.has(item.parsed.data.teamId))
          roles.set(item.parsed.data.teamId, await deps.teams.roleIn(item.parsed.data.teamId, userId))
      }

      return db.transaction(async (tx) => {
        // Lock each team's counter (in a fixed order, so two pushes cannot deadlock): a second push
        // to the same team waits here until this one commits, so revs commit in the order given.
        const counters = new Map<string, number>()
        const revsFor = (teamId: string) => (): number => {
          const rev = counters.get(teamId)! + 1
          counters.set(teamId, rev)
          return rev
        }
        for (const teamId of [...roles.keys()].sort()) {
          counters.set(teamId, await lockCounter(tx, teamId))
        }
        const batch: Batch = { tx, rows: new Map(), inserts: new Map() }
        const wellFormed = items.flatMap(item => (item.parsed.success ? [item.parsed.data] : []))
        const answered = new Map<string, MutationResult>()
        if (wellFormed.length > 0) {
          const seen = await tx.select().from(syncMutations).where(and(eq(syncMutations.clientId, clientId), inArray(syncMutations.mutationId, wellFormed.map(m => m.mutationId))))
          for (const row of seen)
            answered.set(row.mutationId, row.result as MutationResult)
          await preload(batch, wellFormed.filter(m => !answered.has(m.mutationId)))
        }
        const touchedByTeam = new Map<string, Map<string, Touch>>()
        const fresh: { mutationId: string, result: MutationResult }[] = []
        const results: MutationResult[] = []
        for (const item of items) {
          if (!item.parsed.success) {
            const mutationId = isObject(item.raw) && typeof item.raw.mutationId === 'string' ? item.raw.mutationId : `#${item.index}`
            results.push({ mutationId, status: 'rejected', reason: describe(item.parsed.error) })
            continue
          }
          const m = item.parsed.data
          const earlier = answered.get(m.mutationId)
          if (earlier) {
            results.push(earlier)
            continue
          }
          const touched = touchedByTeam.get(m.teamId) ?? new Map()
          touchedByTeam.set(m.teamId, touched)
          const result = await apply(batch, m, roles.get(m.teamId)!, userId, revsFor(m.teamId), touched)
          // The same mutation twice in one batch is answered once.
          answered.set(m.mutationId, result)
          fresh.push({ mutationId: m.mutationId, result })
          results.push(result)
        }
        for (const [teamId, touched] of touchedByTeam)
          await rederive(batch, touched, revsFor(teamId))
        await flush(batch)
        for (let i = 0; i < fresh.length; i += 500)
          await tx.insert(syncMutations).values(fresh.slice(i, i + 500).map(({ mutationId, result }) => ({ clientId, mutationId, userId, result })))
        for (const [teamId, lastRev] of counters)
          await tx.update(teamSyncState).set({ lastRev }).where(eq(teamSyncState.teamId, teamId))
        await deps.hooks?.beforeCommit?.()
        return { results }
      })
    },

    /** Changes after a cursor, in rev order, read from one snapshot so none is skipped. */
    async pull(userId: string, query: unknown): Promise<{ changes: Change[], cursor: number, hasMore: boolean }> {
      const { teamId, since, limit } = PullQuerySchema.parse(query)
      await deps.teams.roleIn(teamId, userId)
      const found = await db.transaction(async (tx) => {
        const rows: { entity: EntityName, row: Row }[] = []
        for (const entity of entityNames) {
          const table = registry[entity].table
          const page = await tx.select().from(table).where(and(eq(table.teamId, teamId), gt(table.rev, since))).orderBy(asc(table.rev)).limit(limit + 1)
          rows.push(...page.map(row => ({ entity, row: row as Row })))
        }
        return rows
      }, { isolationLevel: 'repeatable read', accessMode: 'read only' })
      found.sort((a, b) => a.row.rev - b.row.rev)
      const page = found.slice(0, limit)
      return {
        changes: page.map(({ entity, row }) => ({ entity, id: row.id, rev: row.rev, op: row.deletedAt ? 'delete' : 'put', data: toRecord(row) })),
        cursor: page.at(-1)?.row.rev ?? since,
        hasMore: found.length > limit,
      }
    },

    /** A lead or owner freezes a round: every later change to it, its entries or their brews is refused. */
    async signOffRound(teamId: string, roundId: string, actor: { userId: string }): Promise<Record<string, unknown>> {
      const role = await deps.teams.roleIn(teamId, actor.userId)
      if (role !== 'owner' && role !== 'lead')
        throw new HttpError(403, 'forbidden', 'Only a lead or an owner can sign off a round.')
      return db.transaction(async (tx) => {
        const lastRev = await lockCounter(tx, teamId)
        const [round] = await tx.select().from(rounds).where(and(eq(rounds.id, roundId), eq(rounds.teamId, teamId), isNull(rounds.deletedAt))).for('update')
        if (!round)
          throw new HttpError(404, 'not_found', 'No such round.')
        if (round.signedOffAt)
          return toRecord(round as Row)
        const rev = lastRev + 1
        await tx.update(rounds).set({ signedOffAt: new Date(), signedOffBy: actor.userId, rev, updatedAt: new Date() }).where(eq(rounds.id, roundId))
        await tx.update(teamSyncState).set({ lastRev: rev }).where(eq(teamSyncState.teamId, teamId))
        const [signed] = await tx.select().from(rounds).where(eq(rounds.id, roundId))
        return toRecord(signed as Row)
      })
    },
  }
}

export type SyncService = ReturnType<typeof createSyncService>
