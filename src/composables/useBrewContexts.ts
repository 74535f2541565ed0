import type { Ref } from 'vue'
import type { BrewContext } from '../../shared/schemas/entities'
import type { LocalRecord } from '../db/database'
import type { ContextRecords, JudgedZone } from './brewContexts'
import { computed } from 'vue'
import { findZonePreset } from '../../shared/brewing'
import { db } from '../db/database'
import { contextLabel, judgedZone } from './brewContexts'
import { useLiveQuery } from './useLiveQuery'
import { zoneOf } from './useTeamZones'

const byId = <T extends { id: string }>(rows: T[]): Map<string, T> => new Map(rows.map(row => [row.id, row]))
const empty = { entries: [], rounds: [], events: [], lots: [], recipes: [], zones: [], defaults: [], tables: [], recipeVersions: [], dialIns: [] }

/**
 * Every brew's context and verdict zone, for the team's lists, charts and exports: the records
 * that give context are read once per change (a few hundred even for a year of brews).
 */
export function useBrewContexts(teamId: Ref<string | null>) {
  const { value: rows } = useLiveQuery(async () => {
    if (!teamId.value)
      return empty
    const team = teamId.value
    const [entries, rounds, events, lots, recipes, zones, defaults, tables, recipeVersions, dialIns] = await Promise.all([
      db.entries.where('teamId').equals(team).toArray(),
      db.rounds.where('teamId').equals(team).toArray(),
      db.events.where('teamId').equals(team).toArray(),
      db.lots.where('teamId').equals(team).toArray(),
      db.recipes.where('teamId').equals(team).toArray(),
      db.zones.where('teamId').equals(team).toArray(),
      db.zoneDefaults.where('teamId').equals(team).toArray(),
      db.cuppingTables.where('teamId').equals(team).toArray(),
      db.recipeVersions.where('teamId').equals(team).toArray(),
      db.dialIns.where('teamId').equals(team).toArray(),
    ])
    return { entries, rounds, events, lots, recipes, zones, tables, defaults: defaults.sort((a, b) => (a.rev ?? Infinity) - (b.rev ?? Infinity) || a.createdAt.localeCompare(b.createdAt)), recipeVersions, dialIns }
  }, empty as { entries: LocalRecord<'entry'>[], rounds: LocalRecord<'round'>[], events: LocalRecord<'event'>[], lots: LocalRecord<'lot'>[], recipes: LocalRecord<'recipe'>[], zones: LocalRecord<'zone'>[], defaults: LocalRecord<'zoneDefault'>[], tables: LocalRecord<'cuppingTable'>[], recipeVersions: LocalRecord<'recipeVersion'>[], dialIns: LocalRecord<'dialIn'>[] }, teamId)

  const found = computed<ContextRecords>(() => {
    const teamZones = new Map(rows.value.zones.filter(z => !z.deletedAt).flatMap((record) => {
      const zone = zoneOf(record)
      return zone ? [[zone.id, zone] as const] : []
    }))
    return {
      entries: byId(rows.value.entries),
      rounds: byId(rows.value.rounds),
      events: byId(rows.value.events),
      lots: byId(rows.value.lots),
      recipes: byId(rows.value.recipes),
      zones: id => findZonePreset(id) ?? teamZones.get(id),
      defaults: rows.value.defaults,
      tables: byId(rows.value.tables),
      recipeVersions: byId(rows.value.recipeVersions),
      dialIns: byId(rows.value.dialIns),
    }
  })

  return {
    /** What a brew was measured for, in a few words. */
    labelOf: (context: BrewContext): string => contextLabel(context, found.value),
    /** The zone a brew (or a brew about to be saved) is judged against, and why. */
    zoneOf: (context: BrewContext, method: string): JudgedZone => judgedZone(context, method, found.value),
    found,
  }
}

export type BrewContexts = ReturnType<typeof useBrewContexts>
