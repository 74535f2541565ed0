import type { Ref } from 'vue'
import type { Zone } from '../../shared/brewing'
import type { LocalRecord } from '../db/database'
import { computed } from 'vue'
import { BrewingInputError, defaultZone, defineZone, findZonePreset, zonePresets } from '../../shared/brewing'
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
 * The published presets and the team's own zones, and the one this phone's Zone tab plots against.
 * That choice is the phone's own and only changes what its chart shows: verdicts belong to the brew
 * (useBrewContexts). A team zone deleted meanwhile falls back to the US drip preset.
 */
export function useTeamZones(teamId: Ref<string | null>) {
  const { value: records } = useLiveQuery(async () => (teamId.value ? (await db.zones.where('teamId').equals(teamId.value).toArray()).filter(z => !z.deletedAt) : []), [] as LocalRecord<'zone'>[], teamId)
  const { value: shown } = useLiveQuery(async () => {
    const entry = await db.meta.get(`zone:${teamId.value}:shown`)
    return typeof entry?.value === 'string' ? entry.value : undefined
  }, undefined as string | undefined, teamId)
  const teamZones = computed(() => records.value.flatMap(record => zoneOf(record) ?? []).sort((a, b) => a.name.localeCompare(b.name)))
  const zones = computed<Zone[]>(() => [...zonePresets, ...teamZones.value])
  const find = (id: string | null | undefined): Zone | undefined => (id ? findZonePreset(id) ?? teamZones.value.find(zone => zone.id === id) : undefined)
  /** The zone the Zone tab plots against. */
  const zone = computed<Zone>(() => find(shown.value) ?? defaultZone.filter)

  /** Keeps the phone's choice: by id from the list, or a zone just saved that the list may not show yet. */
  async function choose(choice: string | Zone): Promise<void> {
    const picked = typeof choice === 'string' ? find(choice) : choice
    if (picked)
      await db.meta.put({ key: `zone:${teamId.value}:shown`, value: picked.id })
  }

  return { zones, teamZones, records, zone, find, choose }
}

/** A zone's short name for a segment button. */
export const shortZoneName = (zone: Zone): string => zone.name.replace(' drip standard', '')
