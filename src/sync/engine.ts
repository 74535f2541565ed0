import type { EntityName } from '../../shared/schemas/entities'
import type { MutationResult, PullResponse } from '../../shared/schemas/sync'
import type { OutboxEntry } from '../db/database'
import type { SyncEngineOptions, SyncProgress, SyncStatus, TransportError } from './engine-types'
import { v7 as uuidv7 } from 'uuid'
import { pullPageSize } from '../../shared/schemas/sync'
import { byEntityOf, keepPulled, readServerRecord } from './pull'

export type { SyncProgress, SyncState, SyncStatus, SyncTransport, TransportError } from './engine-types'
export type { SyncEngineOptions } from './engine-types'

class IncompleteAnswer extends Error implements TransportError {
  readonly status = 502
}
const isTransportError = (error: unknown): error is TransportError => typeof error === 'object' && error !== null && 'status' in error && typeof error.status === 'number'

export { readServerRecord } from './pull'

function wait(retry: () => void, delayMs: number): void {
  setTimeout(retry, delayMs)
}

export function createSyncEngine(options: SyncEngineOptions) {
  const { database, transport } = options
  const batchSize = options.batchSize ?? 200
  const pullLimit = options.pullLimit ?? pullPageSize
  const schedule = options.schedule ?? wait
  const isOnline = options.isOnline ?? (() => true)
  let running: Promise<void> | null = null
  let queued: Promise<void> | null = null
  let failures = 0
  /** Records of this run's pulls that this version could not read. */
  let unreadable = 0
  let status: SyncStatus = { state: 'idle', pending: 0, attention: 0, lastSyncedAt: null, oldestPendingAt: null, error: null, progress: null }

  async function clientId(): Promise<string> {
    const stored = await database.meta.get('clientId')
    if (typeof stored?.value === 'string')
      return stored.value
    const id = uuidv7()
    await database.meta.put({ key: 'clientId', value: id })
    return id
  }

  async function report(change: Partial<SyncStatus>): Promise<void> {
    const queued = await database.outbox.toArray()
    const waiting = queued.filter(entry => !entry.rejected)
    // What the person did, not how many mutations it took: a brew and its readings are one change.
    const changes = new Set(waiting.map(entry => (entry.entity === 'reading' && typeof entry.data?.brewId === 'string' ? entry.data.brewId : entry.id)))
    if (status.lastSyncedAt === null && change.lastSyncedAt === undefined) {
      const kept = (await database.meta.get('lastSyncedAt'))?.value
      status = { ...status, lastSyncedAt: typeof kept === 'string' ? kept : null }
    }
    let conflicts = 0
    for (const table of Object.values(database.records))
      conflicts += await table.where('sync.state').equals('conflict').count()
    status = { ...status, ...change, pending: changes.size, attention: conflicts + queued.length - waiting.length, oldestPendingAt: waiting[0]?.createdAt ?? null }
    options.onStatus?.(status)
  }

  async function settle<E extends EntityName>(entity: E, entry: OutboxEntry, result: MutationResult | undefined): Promise<void> {
    const table = database.records[entity]
    const record = await table.get(entry.id)
    const later = (await database.outbox.where('id').equals(entry.id).toArray()).filter(other => other.seq !== entry.seq)
    if (!result) {
      // No answer for it: it goes out again with the next push (the server would recognise it).
      await database.outbox.update(entry.seq!, { sentAt: null })
      return
    }
    if (result.status === 'applied') {
      await database.outbox.delete(entry.seq!)
      // Changes queued behind this one are now based on the rev it produced.
      for (const other of later.filter(o => !o.rejected))
        await database.outbox.update(other.seq!, { baseRev: result.rev ?? null })
      if (record) {
        const stillQueued = later.some(o => !o.rejected)
        await table.put({ ...record, rev: result.rev ?? record.rev, sync: { state: stillQueued ? 'pending' : 'clean', baseRev: result.rev ?? null } })
      }
      return
    }
    const server = result.status === 'conflict' ? readServerRecord(entity, result.server) : undefined
    if (server) {
      // Both copies stay: the phone's in the record, the server's beside it, until the person picks.
      await database.outbox.bulkDelete([entry.seq!, ...later.filter(o => !o.sentAt && !o.rejected).map(o => o.seq!)])
      if (record)
        await table.put({ ...record, sync: { state: 'conflict', baseRev: result.rev ?? record.sync.baseRev, server } })
      return
    }
    if (result.status === 'conflict')
      result = { ...result, status: 'rejected', reason: 'The server has a newer copy that this version of the app cannot read. Update the app, then send it again.' }
    await database.outbox.update(entry.seq!, { rejected: result, sentAt: null })
    if (record)
      await table.put({ ...record, sync: { ...record.sync, state: 'rejected', reason: result.reason } })
  }

  async function pushAll(): Promise<void> {
    const id = await clientId()
    for (;;) {
      // One mutation per record per batch: a later one is based on the rev the earlier one gets,
      // which is only known from its answer, so it waits for the next batch.
      const records = new Set<string>()
      const batch = await database.outbox.orderBy('seq').filter((entry) => {
        if (entry.rejected || records.has(entry.id))
          return false
        records.add(entry.id)
        return true
      }).limit(batchSize).toArray()
      if (batch.length === 0)
        return
      const sentAt = new Date().toISOString()
      await database.outbox.bulkUpdate(batch.map(entry => ({ key: entry.seq!, changes: { sentAt } })))
      const { results } = await transport.push({
        clientId: id,
        mutations: batch.map(({ mutationId, entity, op, id: recordId, teamId, data, baseRev, reason }) => ({ mutationId, entity, op, id: recordId, teamId, data, baseRev, ...(reason ? { reason } : {}) })),
      })
      const byId = new Map(results.map(result => [result.mutationId, result]))
      await database.transaction('rw', [database.outbox, ...database.recordTables], async () => {
        for (const entry of batch)
          await settle(entry.entity, entry, byId.get(entry.mutationId))
      })
      if (!batch.some(entry => byId.has(entry.mutationId)))
        throw new IncompleteAnswer('The team server answered none of the changes sent.')
    }
  }

  /** Shows how far a pull of many pages has come (a new phone's first sync), without a full recount. */
  function progress(next: SyncProgress | null): void {
    status = { ...status, progress: next }
    options.onStatus?.(status)
  }

  /**
   * Pulls a team page by page after its cursor. Each page and its cursor are kept in one
   * transaction over the tables it touches only, so a dropped connection resumes after the last
   * page kept, and screens reading other tables are not held up meanwhile. The next page is asked
   * for as soon as this one arrives, so the server and the network work while the phone stores.
   */
  async function pullTeam(teamId: string): Promise<void> {
    const cursorKey = `cursor:${teamId}`
    const since = Number((await database.meta.get(cursorKey))?.value ?? 0)
    let received = 0
    let next: Promise<PullResponse> | null = transport.pull(teamId, since, pullLimit)
    for (let more = true; more;) {
      const page: PullResponse = await next!
      next = page.hasMore ? transport.pull(teamId, page.cursor, pullLimit) : null
      // A failure of the page asked ahead is met when it is awaited; until then it must not go unhandled.
      next?.catch(() => {})
      const byEntity = byEntityOf(page.changes)
      await database.transaction('rw', [database.meta, ...[...byEntity.keys()].map(entity => database.records[entity])], async () => {
        for (const [entity, changes] of byEntity)
          unreadable += await keepPulled(database, entity, changes)
        await database.meta.put({ key: cursorKey, value: page.cursor })
      })
      more = page.hasMore
      received += page.changes.length
      if (more || status.progress)
        progress(more ? { teamId, received, total: received + (page.remaining ?? 0) } : null)
    }
  }

  async function run(): Promise<void> {
    if (!isOnline()) {
      await report({ state: 'waiting', error: null })
      return
    }
    await report({ state: 'syncing', error: null })
    try {
      unreadable = 0
      await pushAll()
      for (const teamId of options.teamIds())
        await pullTeam(teamId)
      failures = 0
      const lastSyncedAt = new Date().toISOString()
      await database.meta.put({ key: 'lastSyncedAt', value: lastSyncedAt })
      await report({ state: 'idle', lastSyncedAt, error: unreadable ? `${unreadable} records from the team server need a newer version of the app; update it to see them.` : null })
    }
    catch (error) {
      // A pull cut short resumes from its cursor next time; its progress is shown again then.
      status = { ...status, progress: null }
      // Whatever was in flight goes out again next time; the server answers repeats from memory.
      await database.outbox.toCollection().modify((entry) => {
        if (!entry.rejected)
          entry.sentAt = null
      })
      if (isTransportError(error) && error.status === 401) {
        await report({ state: 'signed-out', error: 'Sign in again to send the changes on this phone.' })
        return
      }
      if (isTransportError(error) && error.status !== 0 && error.status < 500) {
        await report({ state: 'error', error: error.message })
        return
      }
      failures += 1
      await report({ state: 'waiting', error: isTransportError(error) ? error.message : String(error) })
      // Signal gone: the 'online' event brings the next try, so no retry is spent (and logged) meanwhile.
      if (isOnline())
        schedule(() => void syncNow(), Math.min(60_000, 1000 * 2 ** (failures - 1)))
    }
  }

  // Pushes everything queued, then pulls every team; one run at a time, and one more after it for a
  // call during a run (a cup saved while the last went out), so nothing saved waits for a timer.
  function syncNow(): Promise<void> {
    if (running) {
      queued ??= running.catch(() => undefined).then(() => {
        queued = null
        return syncNow()
      })
      return queued
    }
    running = run().finally(() => {
      running = null
    })
    return running
  }

  return { syncNow, status: () => status, refreshStatus: () => report({}) }
}

export type SyncEngine = ReturnType<typeof createSyncEngine>
