import type { Zone, ZoneFamily } from '../../shared/brewing'
import type { BrewContext } from '../../shared/schemas/entities'
import type { LocalRecord } from '../db/database'
import { cuppingZone, defaultZone, findZonePreset, methodFamily, zoneFamily } from '../../shared/brewing'
import { dayOf } from '../forms/format'

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
  /** Cupping tables, for the bowls brewed on them. */
  tables?: Map<string, LocalRecord<'cuppingTable'>>
  recipeVersions: Map<string, LocalRecord<'recipeVersion'>>
  dialIns: Map<string, LocalRecord<'dialIn'>>
}

/** What a brew was measured for, in a few words: "Cup K1 · Heat 1", "Recipe: House filter v3 · dial-in at Saltmarsh Night Market". */
export function contextLabel(context: BrewContext, found: ContextRecords): string {
  const session = context.sessionId ? found.dialIns.get(context.sessionId) : undefined
  const dialIn = session ? `dial-in at ${session.place}` : ''
  if (context.kind === 'quick' || !context.refId)
    return dialIn ? `Blank ${dialIn}` : 'Quick brew'
  if (context.kind === 'entry') {
    const entry = found.entries.get(context.refId)
    const round = entry && found.rounds.get(entry.roundId)
    return entry ? `Cup ${entry.code}${round ? ` · ${round.name}` : ''}` : 'A cup not on this phone'
  }
  if (context.kind === 'lot') {
    const lot = found.lots.get(context.refId)
    const table = context.tableId ? found.tables?.get(context.tableId) : undefined
    // The table's day in the phone's locale: one lot is often cupped on several days of a trip.
    const at = table ? ` · table of ${dayOf(`${table.heldOn}T12:00:00`)}` : ''
    return lot ? `Lot: ${lot.farm}${at}` : 'A lot not on this phone'
  }
  const recipe = found.recipes.get(context.refId)
  const version = context.versionId ? found.recipeVersions.get(context.versionId) : undefined
  // The name the version had, when it is on the phone: a recipe renamed later keeps its old brews' names.
  const name = version?.settings.name ?? recipe?.name
  return name ? `Recipe: ${name}${version ? ` v${version.number}` : ''}${dialIn ? ` · ${dialIn}` : ''}` : 'A recipe not on this phone'
}

/** The team's default for a family: the latest choice a lead made, else the family's preset. */
export function teamDefault(family: ZoneFamily, found: ContextRecords): Zone {
  const chosen = found.defaults.filter(choice => choice.family === family && !choice.deletedAt).at(-1)
  const zone = chosen && found.zones(chosen.zoneId)
  return zone && zoneFamily(zone) === family ? zone : defaultZone[family]
}

/**
 * A recipe brew's zone: that of the version it followed (else of the recipe as it stands); a blank
 * dial-in attempt's: that of its session. Undefined when they name none.
 */
function ownZone(context: BrewContext, found: ContextRecords): JudgedZone | undefined {
  if (context.kind === 'recipe' && context.refId) {
    const version = context.versionId ? found.recipeVersions.get(context.versionId) : undefined
    const zoneId = version ? version.settings.zoneId : found.recipes.get(context.refId)?.zoneId
    const zone = zoneId ? found.zones(zoneId) : undefined
    return zone && { zone, source: 'the recipe\'s zone' }
  }
  const session = context.kind === 'quick' && context.sessionId ? found.dialIns.get(context.sessionId) : undefined
  const zone = session?.zoneId ? found.zones(session.zoneId) : undefined
  return zone && { zone, source: 'the dial-in\'s zone' }
}

/**
 * The zone a brew's verdict belongs to: its context's (a cup's round, else its event, for a cup;
 * the cupping zone for a lot's bowl; a recipe's for a recipe brew; a dial-in's for a blank
 * attempt), else the team's default for its family. The same on every phone, list, chart and export, whatever the phone shows
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
  // A lot's brew is a cupping bowl: judged, never dialled in (the cupping zone gives no advice).
  if (context.kind === 'lot' && family === zoneFamily(cuppingZone))
    return { zone: cuppingZone, source: 'the zone for cupping bowls' }
  const own = ownZone(context, found)
  if (own && zoneFamily(own.zone) === family)
    return own
  return { zone: teamDefault(family, found), source: 'the team\'s default' }
}
