import type { Change, MutationResult } from '../../shared/schemas/sync'
import type { SyncTransport } from '../../src/sync/engine'

export const teamId = '0190a8c4-0000-7000-8000-0000000000aa'
export const userId = '0190a8c4-0000-7000-8000-000000000001'

/** What a transport throws with no network (status 0, like the app's ApiError). */
class Offline extends Error {
  readonly status = 0
}

/** A record as the server sends it: its data and the envelope. */
function stored(id: string, record: { rev: number, data: Record<string, unknown>, deleted: boolean }): Record<string, unknown> {
  const at = '2026-12-01T10:00:00.000Z'
  return { ...record.data, id, teamId, createdBy: userId, createdAt: at, updatedAt: at, rev: record.rev, deletedAt: record.deleted ? at : null, derived: null, history: [], historyCount: 0 }
}

/** A fake of the server's contract: revs, conflicts on a stale base, refusals, repeat answers. */
export function fakeServer() {
  const records = new Map<string, { rev: number, data: Record<string, unknown>, deleted: boolean }>()
  const answered = new Map<string, MutationResult>()
  let rev = 0
  let offline = false
  /** Pull pages answered before the connection drops (Infinity: it never does). */
  let pagesBeforeDrop = Infinity
  const pushes: unknown[] = []
  /** The cursor of each pull asked for, in order. */
  const pulls: number[] = []
  const transport: SyncTransport = {
    async push(body) {
      if (offline)
        throw new Offline('No network')
      pushes.push(body)
      return {
        results: body.mutations.map((m) => {
          const seen = answered.get(m.mutationId)
          if (seen)
            return seen
          const current = records.get(m.id)
          let result: MutationResult
          if (m.data?.label === 'refuse me') {
            result = { mutationId: m.mutationId, status: 'rejected', reason: 'label: refused by the fake' }
          }
          else if (current && (m.baseRev === null || current.rev > m.baseRev)) {
            result = { mutationId: m.mutationId, status: 'conflict', rev: current.rev, server: stored(m.id, current) }
          }
          else {
            rev += 1
            records.set(m.id, { rev, data: { ...current?.data, ...m.data }, deleted: m.op === 'delete' })
            result = { mutationId: m.mutationId, status: 'applied', rev }
          }
          answered.set(m.mutationId, result)
          return result
        }),
      }
    },
    async pull(_team, since, limit) {
      if (offline || pagesBeforeDrop <= 0)
        throw new Offline('No network')
      pagesBeforeDrop -= 1
      pulls.push(since)
      const after: Change[] = [...records.entries()].filter(([, r]) => r.rev > since).sort((a, b) => a[1].rev - b[1].rev).map(([id, r]) => ({ entity: 'instrument', id, rev: r.rev, op: r.deleted ? 'delete' : 'put', data: stored(id, r) }))
      const changes = after.slice(0, limit)
      return { changes, cursor: changes.at(-1)?.rev ?? since, hasMore: after.length > limit, remaining: after.length - changes.length }
    },
  }
  return {
    transport,
    records,
    pushes,
    pulls,
    /** The connection drops after this many more pull pages. */
    dropAfterPages: (pages: number) => {
      pagesBeforeDrop = pages
    },
    setOffline: (value: boolean) => {
      offline = value
    },
    /** Another phone's edit, straight into the server. */
    editElsewhere: (id: string, data: Record<string, unknown>) => {
      rev += 1
      records.set(id, { rev, data: { ...records.get(id)!.data, ...data }, deleted: false })
    },
  }
}
