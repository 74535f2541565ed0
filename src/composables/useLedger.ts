import type { Ref } from 'vue'
import type { LedgerFilters, ZoneFor } from '../forms/ledgerFilters'
import { computed, ref } from 'vue'
import { countBrews, ledgerIds } from '../db/ledgerQueries'
import { noFilters } from '../forms/ledgerFilters'
import { useLiveQuery } from './useLiveQuery'

export { filterBrews, inZone, noFilters, periodSpan } from '../forms/ledgerFilters'
export type { ContextFilter, LedgerFilters, MethodFilter, PeriodFilter, ZoneFilter, ZoneFor } from '../forms/ledgerFilters'

// One selection for the Ledger and the Zone chart: the brews listed are the brews plotted.
const filters = ref<LedgerFilters>({ ...noFilters })

/**
 * The team's brews on this phone through the filters the Ledger and Zone share: the ids of the
 * brews kept, newest first, and how many the team holds. Ids only, from indexes: a screen reads
 * the brews it shows (a window of rows, a chunk of points) by id.
 */
export function useLedger(teamId: Ref<string | null>, zoneFor: ZoneFor) {
  const { value: ids, state } = useLiveQuery(async () => (teamId.value ? ledgerIds(teamId.value, filters.value, zoneFor) : []), [] as string[], computed(() => [teamId.value, filters.value]))
  const { value: total, state: counted } = useLiveQuery(async () => (teamId.value ? countBrews(teamId.value) : 0), 0, teamId)
  const filtered = computed(() => Object.entries(filters.value).some(([key, value]) => value !== noFilters[key as keyof LedgerFilters]))
  return { filters, ids, total, counted, filtered, state }
}
