import type { Zone, ZoneFamily } from '../../shared/brewing'
import type { BrewContext } from '../../shared/schemas/entities'
import type { LocalRecord } from '../db/database'
import { defaultZone, findZonePreset, methodFamily, zoneFamily } from '../../shared/brewing'

/** The zone a brew is judged against, and where it comes from, in words for the screen. */
export interface JudgedZone {
  zone: Zone
  /** "the event's zone", "the team's default" … */
  source: string
}

/** The team's records that give brews their context, read once for every list and chart. */
export interface ContextRecords {
  entries: Map<string, LocalRecord<'entry'>>
  rounds: Map<string, LocalRecord<'round'>>
  events: Map<string, LocalRecord<'event'>>
  lots: Map<string, LocalRecord<'lot'>>
  recipes: Map<string, LocalRecord<'recipe'>>
  /** Presets and the team's own zones, by id. */
  zones: (id: string) => Zone | undefined
  /** The team's default choices, newest last. */
  defaults: LocalRecord<'zoneDefault'>[]
}

/** What a brew was measured for, in a few words: "Cup K1 · Heat 1", "Lot: Alder Ridge Estate". */
export function contextLabel(context: BrewContext, found: ContextRecords): string {
  if (context.kind === 'quick' || !context.refId)
    return 'Quick brew'
  if (context.kind === 'entry') {
    const entry = found.entries.get(context.refId)
    const round = entry && found.rounds.get(entry.roundId)
    return entry ? `Cup ${entry.code}${round ? ` · ${round.name}` : ''}` : 'A cup not on this phone'
  }
  if (context.kind === 'lot') {
    const lot = found.lots.get(context.refId)
    return lot ? `Lot: ${lot.farm}` : 'A lot not on this phone'
  }
  const recipe = found.recipes.get(context.refId)
  return recipe ? `Recipe: ${recipe.name}` : 'A recipe not on this phone'
}

/** The team's default for a family: the latest choice a lead made, else the family's preset. */
export function teamDefault(family: ZoneFamily, found: ContextRecords): Zone {
  const chosen = found.defaults.filter(choice => choice.family === family && !choice.deletedAt).at(-1)
  const zone = chosen && found.zones(chosen.zoneId)
  return zone && zoneFamily(zone) === family ? zone : defaultZone[family]
}

/**
 * The zone a brew's verdict belongs to: its context's (a cup's round, else its event), else the team's
 * default for its family. The same on every phone, list, chart and export, whatever the phone shows
 * on its own chart. A zone of the wrong family (a drip zone for an espresso) is never used.
 */
export function judgedZone(context: BrewContext, method: string, found: ContextRecords): JudgedZone {
  const family = methodFamily(method)
  if (context.kind === 'entry' && context.refId) {
    // A cup is judged by its round's zone, which is the event's unless the round sets its own.
    const entry = found.entries.get(context.refId)
    const round = entry && found.rounds.get(entry.roundId)
    const event = round && found.events.get(round.eventId)
    const own = round?.zoneId ? found.zones(round.zoneId) ?? findZonePreset(round.zoneId) : undefined
    if (own && zoneFamily(own) === family)
      return { zone: own, source: 'the round\'s zone' }
    const zone = event && (found.zones(event.zoneId) ?? findZonePreset(event.zoneId))
    if (zone && zoneFamily(zone) === family)
      return { zone, source: 'the event\'s zone' }
  }
  return { zone: teamDefault(family, found), source: 'the team\'s default' }
}
