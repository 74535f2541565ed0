import type { Ref } from 'vue'
import type { Zone } from '../../shared/brewing'
import type { LocalRecord } from '../db/database'
import { computed, ref } from 'vue'
import { computeBrew, formatTds, formatYield, roundHalfUp, zoneVerdict } from '../../shared/brewing'
import { brewsNewestFirst } from '../db/queries'
import { useLiveQuery } from './useLiveQuery'

export type MethodFilter = 'all' | 'percolation' | 'immersion' | 'espresso'
export type PeriodFilter = 'today' | 'week' | 'all'
export type ZoneFilter = 'all' | 'in' | 'out'

export interface LedgerFilters { method: MethodFilter, period: PeriodFilter, zone: ZoneFilter, search: string }

const dayMs = 24 * 60 * 60 * 1000
const tdsOf = (brew: LocalRecord): number | null => (typeof brew.derived?.tdsPercent === 'number' ? brew.derived.tdsPercent : null)
const eyOf = (brew: LocalRecord): number | null => (typeof brew.derived?.yieldPercent === 'number' ? brew.derived.yieldPercent : null)

/** Whether a brew's figures sit in the zone; null when they are not known yet. */
export function inZone(brew: LocalRecord, zone: Zone): boolean | null {
  const tds = tdsOf(brew)
  const ey = eyOf(brew)
  return tds !== null && ey !== null ? zoneVerdict(zone, { tdsPercent: tds, yieldPercent: ey }).inZone : null
}

/** The team's brews on this phone, newest first, through the filters. */
export function useLedger(teamId: Ref<string | null>, zone: Ref<Zone>) {
  const filters = ref<LedgerFilters>({ method: 'all', period: 'all', zone: 'all', search: '' })
  const { value: brews, state } = useLiveQuery(async () => {
    return teamId.value ? brewsNewestFirst(teamId.value) : []
  }, [] as LocalRecord[])

  const shown = computed(() => {
    const { method, period, zone: zoneFilter, search } = filters.value
    const since = period === 'today' ? Date.now() - dayMs : period === 'week' ? Date.now() - 7 * dayMs : 0
    const words = search.trim().toLowerCase()
    return brews.value.filter((brew) => {
      if (method !== 'all' && brew.method !== method)
        return false
      if (since && Date.parse(String(brew.brewedAt)) < since)
        return false
      if (zoneFilter !== 'all' && inZone(brew, zone.value) !== (zoneFilter === 'in'))
        return false
      return !words || `${brew.notes ?? ''} ${brew.grindSetting ?? ''}`.toLowerCase().includes(words)
    })
  })

  return { filters, brews, shown, state }
}

/** The rows of the CSV export, with units in the headers. */
export function ledgerRows(brews: LocalRecord[], zone: Zone): Record<string, string | number>[] {
  const number = (value: unknown): number | string => (typeof value === 'number' ? value : '')
  // Net masses as the core computes them (gross minus tare where weighed so), to 2 decimals.
  const masses = (brew: LocalRecord) => computeBrew({ ...(brew as never as Parameters<typeof computeBrew>[0]), readings: [] })
  const grams = (value: number | null): number | string => (value === null ? '' : roundHalfUp(value, 2))
  return brews.map(brew => ({
    'brewed at (ISO 8601)': String(brew.brewedAt),
    'method': String(brew.method),
    'TDS (%)': tdsOf(brew) === null ? '' : formatTds(tdsOf(brew)!),
    'extraction yield (%)': eyOf(brew) === null ? '' : formatYield(eyOf(brew)!),
    'dose (g)': grams(masses(brew).dose),
    'beverage (g)': grams(brew.method === 'immersion' ? null : masses(brew).beverageMass),
    'water (g)': number(brew.waterMass),
    'LRR (g/g)': number(brew.retainedRatio),
    'grind setting': String(brew.grindSetting ?? ''),
    [`in zone (${zone.name})`]: inZone(brew, zone) === null ? '' : inZone(brew, zone) ? 'yes' : 'no',
    'notes': String(brew.notes ?? ''),
    'synced': brew.sync.state === 'clean' ? 'yes' : 'no',
  }))
}
