import type { BrewContext, EntityData, EntityName } from '../schemas/entities'
import { entityNames } from '../schemas/entities'

/** A pointer from one record to another. */
export interface RecordRef { entity: EntityName, id: string }

/** What the record layer needs to know of an entity, beyond the shape of its data. */
export interface EntityDefinition<E extends EntityName> {
  /** What a person calls one and several of them, for messages. */
  noun: { one: string, many: string }
  /** What a person recognises one record by, in a few words. */
  title: (data: EntityData<E>) => string
  /** Who may create and change such records: any member, or only a lead or an owner. */
  writers: 'member' | 'lead'
  /** Never edited, never deleted once stored (readings). */
  appendOnly: boolean
  /**
   * Whose record decides who may write this one: its own author, or the author of its parent (a
   * reading is part of its brew: adding one changes the brew's result).
   */
  governedBy: 'self' | 'parent'
  /** What a record governed by its parent is part of, for messages ("brews"); brews when not given. */
  partOf?: string
  /** A teammate's record is changed only with a reason, which its history keeps. */
  reasonForTeammate: boolean
  /** The record this one belongs to (kept in an indexed column on the server). */
  parent: (data: EntityData<E>) => RecordRef | null
  /** Every record it points at that must exist in the same team (the parent among them). */
  links: (data: EntityData<E>) => RecordRef[]
}

type Definitions = { [E in EntityName]: EntityDefinition<E> }

const ref = (entity: EntityName, id: string | null | undefined): RecordRef | null => (id ? { entity, id } : null)
const contextRef = (context: BrewContext): RecordRef | null => (context.kind === 'quick' ? null : ref(context.kind, context.refId))
const plain = { writers: 'member', appendOnly: false, governedBy: 'self', reasonForTeammate: false } as const
const noun = (one: string, many = `${one}s`) => ({ noun: { one, many } })
const standalone = { ...plain, parent: () => null, links: () => [] }
const child = <E extends EntityName>(parent: (data: EntityData<E>) => RecordRef | null) => ({ ...plain, parent, links: (data: EntityData<E>) => [parent(data)].filter(r => r !== null) })

export const entities: Definitions = {
  instrument: { ...standalone, ...noun('instrument'), title: data => data.label },
  calibration: { ...child<'calibration'>(data => ref('instrument', data.instrumentId)), ...noun('calibration'), title: data => `Calibration of ${data.calibratedAt.slice(0, 10)}` },
  brew: {
    ...plain,
    ...noun('brew'),
    title: data => `${data.method.charAt(0).toUpperCase()}${data.method.slice(1)} brew of ${data.brewedAt.slice(0, 10)}`,
    reasonForTeammate: true,
    parent: data => contextRef(data.context),
    links: data => [contextRef(data.context), ref('calibration', data.calibrationId), data.context.kind === 'lot' ? ref('cuppingTable', data.context.tableId) : null, ref('recipeVersion', data.context.versionId), ref('dialIn', data.context.sessionId)].filter(r => r !== null),
  },
  reading: { ...child<'reading'>(data => ref('brew', data.brewId)), ...noun('reading'), title: data => `Reading ${data.value}`, appendOnly: true, governedBy: 'parent', reasonForTeammate: true },
  // A competition is set up by a lead or an owner (the head judge); members measure its pours.
  event: { ...standalone, ...noun('event'), title: data => data.name, writers: 'lead' },
  round: { ...child<'round'>(data => ref('event', data.eventId)), ...noun('round'), title: data => data.name, writers: 'lead' },
  entry: { ...child<'entry'>(data => ref('round', data.roundId)), ...noun('cup'), title: data => `Cup ${data.code}`, writers: 'lead' },
  trip: { ...standalone, ...noun('trip'), title: data => data.name },
  lot: { ...child<'lot'>(data => ref('trip', data.tripId)), ...noun('lot'), title: data => data.farm },
  recipe: { ...standalone, ...noun('recipe'), title: data => data.name, links: data => [ref('recipeVersion', data.versionId)].filter(r => r !== null) },
  zone: { ...standalone, ...noun('zone'), title: data => data.name },
  zoneDefault: { ...standalone, ...noun('default zone'), title: data => `Default ${data.family} zone`, writers: 'lead', appendOnly: true },
  signoff: { ...child<'signoff'>(data => ref('round', data.roundId)), ...noun('sign-off'), title: () => 'Sign-off of the round', writers: 'lead', appendOnly: true },
  zeroCheck: { ...child<'zeroCheck'>(data => ref('instrument', data.instrumentId)), ...noun('zero check'), title: data => `Zero check of ${data.checkedAt.slice(0, 10)}`, appendOnly: true },
  cuppingTable: {
    ...plain,
    ...noun('cupping table'),
    title: data => `Cupping table of ${data.heldOn}${data.place ? ` at ${data.place}` : ''}`,
    parent: data => ref('trip', data.tripId),
    links: data => [ref('trip', data.tripId), ...data.lotIds.map(id => ref('lot', id)), ref('scoreSheet', data.scoreSheetId)].filter(r => r !== null),
  },
  // The team's score sheets are set up by a lead, like its default zones.
  scoreSheet: { ...standalone, ...noun('score sheet'), title: data => data.name, writers: 'lead' },
  score: {
    ...plain,
    ...noun('score'),
    title: () => 'Cupping score',
    reasonForTeammate: true,
    parent: data => ref('cuppingTable', data.tableId),
    links: data => [ref('cuppingTable', data.tableId), ref('lot', data.lotId)].filter(r => r !== null),
  },
  photo: {
    ...plain,
    ...noun('photo'),
    title: data => data.caption || `Photo of ${data.takenAt.slice(0, 10)}`,
    parent: data => ref('brew', data.brewId) ?? ref('lot', data.lotId) ?? ref('trip', data.tripId),
    links: data => [ref('trip', data.tripId), ref('lot', data.lotId), ref('brew', data.brewId)].filter(r => r !== null),
  },
  // A version is part of its recipe (who may add one is decided by the recipe's author), and carries
  // its own reason. Its recipe is checked by the recipe rules, not as a link: a new recipe's first
  // version reaches the server before the recipe that names it.
  recipeVersion: { ...plain, ...noun('recipe version'), title: data => `Version ${data.number}`, appendOnly: true, governedBy: 'parent', partOf: 'recipes', parent: data => ref('recipe', data.recipeId), links: () => [] },
  houseRecipe: { ...standalone, ...noun('house recipe'), title: data => `House ${data.method} recipe`, writers: 'lead', appendOnly: true, links: data => [ref('recipe', data.recipeId)].filter(r => r !== null) },
  dialIn: { ...standalone, ...noun('dial-in session'), title: data => `Dial-in at ${data.place}`, links: data => [ref('recipe', data.recipeId)].filter(r => r !== null) },
}

/**
 * An entity's definition, for code that handles any entity. Its functions take that entity's data:
 * callers pass data that passed the same entity's schema.
 */
export function definitionOf<E extends EntityName>(entity: E): EntityDefinition<E> {
  return entities[entity] as EntityDefinition<E>
}

const known: ReadonlySet<string> = new Set(entityNames)
export const isEntityName = (name: string): name is EntityName => known.has(name)
