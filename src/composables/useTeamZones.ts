import type { Ref } from 'vue'
import type { Zone, ZoneFamily } from '../../shared/brewing'
import type { LocalRecord } from '../db/database'
import { computed } from 'vue'
import { BrewingInputError, defaultZone, defineZone, findZonePreset, methodFamily, zoneFamily, zonePresets } from '../../shared/brewing'
import { db } from '../db/database'
import { useLiveQuery } from './useLiveQuery'

/** A team zone record as the core's Zone; null if it no longer checks out. */
export function zoneOf(record: LocalRecord<'zone'>): Zone | null {
  try {
    return defineZone({ id: record.id, name: record.name, tdsPercent: record.tdsPercent, yieldPercent: record.yieldPercent, source: 'Team zone' })
  }
  catch (error) {
    if (error instanceof BrewingInputError)
      return null
    throw error
  }
}

/**
 * The published presets and the team's own zones, and the ones the team last chose on this phone:
 * one for filter brews and one for espresso (a brew is judged against a zone of its own family),
 * plus the one the Zone tab shows. A team zone deleted meanwhile falls back to the family's preset.
 */
export function useTeamZones(teamId: Ref<string | null>) {
  const { value: records } = useLiveQuery(async () => (teamId.value ? (await db.zones.where('teamId').equals(teamId.value).toArray()).filter(z => !z.deletedAt) : []), [] as LocalRecord<'zone'>[], teamId)
  const { value: chosen } = useLiveQuery(async () => {
    const keys = ['shown', 'filter', 'espresso'].map(part => `zone:${teamId.value}:${part}`)
    const [shown, filter, espresso] = (await db.meta.bulkGet(keys)).map(entry => (typeof entry?.value === 'string' ? entry.value : undefined))
    return { shown, filter, espresso }
  }, {} as Partial<Record<'shown' | ZoneFamily, string>>, teamId)
  const teamZones = computed(() => records.value.flatMap(record => zoneOf(record) ?? []).sort((a, b) => a.name.localeCompare(b.name)))
  const zones = computed<Zone[]>(() => [...zonePresets, ...teamZones.value])
  const find = (id: string | null | undefined): Zone | undefined => (id ? findZonePreset(id) ?? teamZones.value.find(zone => zone.id === id) : undefined)
  /** The zone a brew of this method is judged against. */
  const zoneFor = (method: string): Zone => {
    const family = methodFamily(method)
    const found = find(chosen.value[family])
    return found && zoneFamily(found) === family ? found : defaultZone[family]
  }
  /** The zone the Zone tab plots against. */
  const zone = computed<Zone>(() => find(chosen.value.shown) ?? zoneFor('percolation'))
  const zonesFor = (method: string): Zone[] => zones.value.filter(z => zoneFamily(z) === methodFamily(method))

  /** Keeps a choice: by id from the list, or a zone just saved that the list may not show yet. */
  async function choose(choice: string | Zone): Promise<void> {
    const picked = typeof choice === 'string' ? find(choice) : choice
    if (!picked)
      return
    await db.meta.bulkPut([{ key: `zone:${teamId.value}:shown`, value: picked.id }, { key: `zone:${teamId.value}:${zoneFamily(picked)}`, value: picked.id }])
  }

  return { zones, zonesFor, teamZones, records, zone, zoneFor, find, choose }
}

/** A zone's short name for a segment button. */
export const shortZoneName = (zone: Zone): string => zone.name.replace(' drip standard', '')
