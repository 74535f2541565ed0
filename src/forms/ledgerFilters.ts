// The Ledger's filters as pure functions: which brews a selection keeps, and the time span of a
// period in the phone's time zone (src/db/ledgerQueries.ts turns them into index ranges).
import type { Zone } from '../../shared/brewing'
import type { ContextKind } from '../../shared/schemas/entities'
import type { LocalRecord } from '../db/database'
import { zoneVerdict } from '../../shared/brewing'

export type MethodFilter = 'all' | 'percolation' | 'immersion' | 'espresso'
export type PeriodFilter = 'today' | 'week' | 'all' | 'dates'
export type ContextFilter = 'all' | ContextKind
export type ZoneFilter = 'all' | 'in' | 'out'
/** The zone a brew's verdict belongs to (useBrewContexts). */
export type ZoneFor = (brew: LocalRecord<'brew'>) => Zone

export interface LedgerFilters {
  method: MethodFilter
  period: PeriodFilter
  /** First and last day (YYYY-MM-DD, local) when the period is 'dates'; blank leaves that end open. */
  from: string
  to: string
  context: ContextFilter
  zone: ZoneFilter
  search: string
}

export const noFilters: LedgerFilters = { method: 'all', period: 'all', from: '', to: '', context: 'all', zone: 'all', search: '' }

const dayMs = 24 * 60 * 60 * 1000
type Brew = LocalRecord<'brew'>
const tdsOf = (brew: Brew): number | null => brew.derived?.tdsPercent ?? null
const eyOf = (brew: Brew): number | null => brew.derived?.yieldPercent ?? null

/** Whether a brew's figures sit in the zone; null when they are not known yet. */
export function inZone(brew: Brew, zone: Zone): boolean | null {
  const tds = tdsOf(brew)
  const ey = eyOf(brew)
  return tds !== null && ey !== null ? zoneVerdict(zone, { tdsPercent: tds, yieldPercent: ey }).inZone : null
}

/** Midnight of the phone's calendar day, `daysBack` days before the one holding `now`. */
function startOfDay(now: number, daysBack = 0): number {
  const day = new Date(now)
  day.setHours(0, 0, 0, 0)
  day.setDate(day.getDate() - daysBack)
  return day.getTime()
}

/**
 * The time span a period filter keeps, in ms since the epoch, in the phone's time zone: today is
 * the calendar day (not the last 24 h), 7 days is today and the six days before.
 */
export function periodSpan(f: LedgerFilters, now: number): [number, number] {
  if (f.period === 'today')
    return [startOfDay(now), Infinity]
  if (f.period === 'week')
    return [startOfDay(now, 6), Infinity]
  if (f.period === 'dates') {
    const start = f.from ? new Date(`${f.from}T00:00:00`).getTime() : -Infinity
    const end = f.to ? new Date(`${f.to}T00:00:00`).getTime() + dayMs : Infinity
    return [Number.isNaN(start) ? -Infinity : start, Number.isNaN(end) ? Infinity : end]
  }
  return [-Infinity, Infinity]
}

/** The brews a set of filters keeps, in the order given. */
export function filterBrews(brews: Brew[], f: LedgerFilters, zoneFor: ZoneFor, now = Date.now()): Brew[] {
  const [start, end] = periodSpan(f, now)
  const words = f.search.trim().toLowerCase()
  return brews.filter((brew) => {
    const at = Date.parse(brew.brewedAt)
    if (f.method !== 'all' && brew.method !== f.method)
      return false
    if (at < start || at >= end)
      return false
    if (f.context !== 'all' && brew.context.kind !== f.context)
      return false
    if (f.zone !== 'all' && inZone(brew, zoneFor(brew)) !== (f.zone === 'in'))
      return false
    return !words || `${brew.notes} ${brew.grindSetting}`.toLowerCase().includes(words)
  })
}
