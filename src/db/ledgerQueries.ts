import type { LedgerFilters, ZoneFor } from '../composables/useLedger'
import type { LocalRecord } from './database'
import { filterBrews, periodSpan } from '../composables/useLedger'
import { db } from './database'

type Brew = LocalRecord<'brew'>

/** Brews read at a time where a screen goes through many: a few hundred kilobytes, never the year. */
export const brewChunk = 500
const top = '\uFFFF'

/** The ids of the team's deleted brews (a brew not deleted has no key in that index). */
async function deletedIds(teamId: string): Promise<Set<string>> {
  return new Set(await db.brews.where('[teamId+deletedAt]').between([teamId, ''], [teamId, top]).primaryKeys())
}

/** How many brews the team holds on this phone, deleted ones left out: counted on indexes only. */
export async function countBrews(teamId: string): Promise<number> {
  const all = await db.brews.where('[teamId+brewedAt]').between([teamId, ''], [teamId, top]).count()
  return all - (await deletedIds(teamId)).size
}

/**
 * The ids of the brews a set of Ledger filters keeps, newest first, read from indexes: the period
 * is a range of brewedAt (ISO times in UTC, as phones write them, so the strings sort as the times
 * do), method and kind of context each have an index of their own. Only a zone or a search
 * filter needs the brews themselves, and those are read a chunk at a time, keeping only the ids.
 */
export async function ledgerIds(teamId: string, filters: LedgerFilters, zoneFor: ZoneFor, now = Date.now()): Promise<string[]> {
  const [start, end] = periodSpan(filters, now)
  const low = Number.isFinite(start) ? new Date(start).toISOString() : ''
  const high = Number.isFinite(end) ? new Date(end).toISOString() : top
  const byMethod = () => db.brews.where('[teamId+method+brewedAt]').between([teamId, filters.method, low], [teamId, filters.method, high], true, false).primaryKeys()
  const byContext = () => db.brews.where('[teamId+context.kind+brewedAt]').between([teamId, filters.context, low], [teamId, filters.context, high], true, false).primaryKeys()
  let ids = filters.method !== 'all'
    ? await byMethod()
    : filters.context !== 'all'
      ? await byContext()
      : await db.brews.where('[teamId+brewedAt]').between([teamId, low], [teamId, high], true, false).primaryKeys()
  if (filters.method !== 'all' && filters.context !== 'all') {
    const inContext = new Set(await byContext())
    ids = ids.filter(id => inContext.has(id))
  }
  const deleted = await deletedIds(teamId)
  // Oldest first from the index; the Ledger lists the newest first.
  ids = ids.filter(id => !deleted.has(id)).reverse()
  if (filters.zone === 'all' && !filters.search.trim())
    return ids
  const rest: LedgerFilters = { ...filters, period: 'all', method: 'all', context: 'all' }
  const kept: string[] = []
  for (let i = 0; i < ids.length; i += brewChunk) {
    const chunk = (await db.brews.bulkGet(ids.slice(i, i + brewChunk))).filter((brew): brew is Brew => Boolean(brew))
    kept.push(...filterBrews(chunk, rest, zoneFor, now).map(brew => brew.id))
  }
  return kept
}

/**
 * The two figures of each of these brews that has a result, read as keys of the figures index (no
 * brew is read whole): how the chart gets a year of brews.
 */
export async function figuresOf(teamId: string, ids: string[]): Promise<{ id: string, tdsPercent: number, yieldPercent: number }[]> {
  const wanted = new Set(ids)
  const found: { id: string, tdsPercent: number, yieldPercent: number }[] = []
  await db.brews.where('[teamId+derived.tdsPercent+derived.yieldPercent]').between([teamId, -Infinity, -Infinity], [teamId, Infinity, Infinity], true, true).eachKey((key, cursor) => {
    const id = String(cursor.primaryKey)
    if (wanted.has(id) && Array.isArray(key))
      found.push({ id, tdsPercent: Number(key[1]), yieldPercent: Number(key[2]) })
  })
  return found
}

/** The brews of these ids, in the order given (a window of the Ledger, or an export asked for). */
export async function brewsOf(ids: string[]): Promise<Brew[]> {
  const found: Brew[] = []
  for (let i = 0; i < ids.length; i += brewChunk)
    found.push(...(await db.brews.bulkGet(ids.slice(i, i + brewChunk))).filter((brew): brew is Brew => Boolean(brew)))
  return found
}

/**
 * Goes through the brews of these ids a chunk at a time, handing each chunk to `take` and keeping
 * nothing itself: a screen keeps what it needs of each brew (a chart its two figures).
 */
export async function eachBrewChunk(ids: string[], take: (brews: Brew[]) => void): Promise<void> {
  for (let i = 0; i < ids.length; i += brewChunk)
    take((await db.brews.bulkGet(ids.slice(i, i + brewChunk))).filter((brew): brew is Brew => Boolean(brew)))
}
