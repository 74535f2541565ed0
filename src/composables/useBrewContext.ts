import type { Ref } from 'vue'
import type { BrewMethod } from '../../shared/brewing'
import type { BrewContext, ContextKind } from '../../shared/schemas/entities'
import type { LocalRecord } from '../db/database'
import type { BrewForm } from './useBrewForm'
import { cuppingDose, formatMass } from '../../shared/brewing'
import { db } from '../db/database'
import { dayOf, grams } from '../forms/format'
import { formatDuration, numberText } from '../forms/numbers'
import { capital } from '../forms/words'
import { houseRecipes, methodOrder } from './recipeBook'
import { useLiveQuery } from './useLiveQuery'

/** What a brew was measured for, in words, with what it brings to the form. */
export interface BrewContextView {
  kind: ContextKind
  /** The recipe, lot or event entry; null for a quick brew or one not on this phone. */
  refId: string | null
  title: string
  detail: string
  /** What choosing it fills in: a recipe's method and settings, a cupping's immersion. */
  defaults: Partial<BrewForm>
  /** An event entry is judged against the event's zone. */
  zoneId: string | null
  /** An entry in a signed-off round takes no more brews. */
  closed: boolean
  /** Where the context's own screen is (a cup's round board), to go back to it. */
  link?: { to: string, text: string }
  /** The method a recipe is the crew's house recipe of. */
  house?: BrewMethod
}

const quick: BrewContextView = { kind: 'quick', refId: null, title: 'Quick brew', detail: 'Not tied to a recipe, a lot or an event.', defaults: {}, zoneId: null, closed: false }

type ContextEntity = Exclude<ContextKind, 'quick'>
type ContextRecord = { [K in ContextEntity]: { kind: K, record: LocalRecord<K> } }[ContextEntity]

/** Resolves a context from the phone's store; a record not (or no longer) here reads as missing. */
export async function describeContext(context: BrewContext): Promise<BrewContextView> {
  const { kind, refId } = context
  if (kind === 'quick' || !refId)
    return quick
  const found = await findContext(kind, refId)
  if (!found || found.record.deletedAt)
    return { ...quick, kind, title: 'Not on this phone', detail: 'The record this brew belongs to has not synced here, or was deleted.' }
  const view = await describeRecord(found)
  const table = kind === 'lot' && context.tableId ? await db.cuppingTables.get(context.tableId) : undefined
  if (!table || table.deletedAt)
    return view
  // A bowl on a cupping table follows the table's protocol: its dose, water, grind and temperature.
  return {
    ...view,
    detail: [view.detail.split(' · cupping bowl')[0], `table of ${dayOf(`${table.heldOn}T12:00:00`)}${table.place ? ` at ${table.place}` : ''}`, `${grams(table.doseG)} per ${formatMass(table.waterMl, 1)} mL`].filter(Boolean).join(' · '),
    defaults: { method: 'immersion', byDifference: false, dose: numberText(table.doseG), waterMass: numberText(table.waterMl), grindSetting: table.grind, waterTemperature: numberText(table.waterTemperatureC) },
  }
}

async function findContext(kind: ContextEntity, id: string): Promise<ContextRecord | undefined> {
  if (kind === 'recipe') {
    const record = await db.recipes.get(id)
    return record && { kind, record }
  }
  if (kind === 'lot') {
    const record = await db.lots.get(id)
    return record && { kind, record }
  }
  const record = await db.entries.get(id)
  return record && { kind, record }
}

/** A recipe, lot or event entry already read, in words, with what it points at (trip, round, event). */
async function describeRecord(found: ContextRecord): Promise<BrewContextView> {
  const base = { ...quick, kind: found.kind, refId: found.record.id }
  if (found.kind === 'recipe') {
    const recipe = found.record
    const version = recipe.versionId ? await db.recipeVersions.get(recipe.versionId) : undefined
    const masses = recipe.method === 'espresso' || recipe.waterMass === null
      ? `${formatMass(recipe.dose)} g → ${formatMass(recipe.beverageMass ?? 0)} g${recipe.contactTimeSeconds !== null ? ` in ${formatDuration(recipe.contactTimeSeconds)}` : ''}`
      : `${formatMass(recipe.dose)} g in ${formatMass(recipe.waterMass)} g of water`
    return {
      ...base,
      title: `Recipe: ${recipe.name}${version ? ` v${version.number}` : ''}`,
      detail: [capital(recipe.method), masses, recipe.grindSetting].filter(Boolean).join(' · '),
      // The version it follows goes with the brew; an espresso takes no water, whatever the form held.
      defaults: { context: { kind: 'recipe', refId: recipe.id, versionId: recipe.versionId }, method: recipe.method, waterMass: recipe.method === 'espresso' ? '' : numberText(recipe.waterMass), grindSetting: recipe.grindSetting, contactTime: formatDuration(recipe.contactTimeSeconds), waterTemperature: numberText(recipe.waterTemperatureC) },
    }
  }
  if (found.kind === 'lot') {
    const lot = found.record
    const trip = lot.tripId ? await db.trips.get(lot.tripId) : undefined
    // SCA cupping protocol: 8.25 g ± 0.25 g of coffee per 150 mL of water.
    const bowl = cuppingDose(150)
    const cupping = `cupping bowl: ${formatMass(bowl.dose, 0.01)} g (${formatMass(bowl.min, 0.01)}–${formatMass(bowl.max, 0.01)}) per 150 mL`
    return { ...base, title: `Lot: ${lot.farm}`, detail: [lot.region, lot.variety, lot.process, trip?.name, cupping].filter(Boolean).join(' · '), defaults: { method: 'immersion' } }
  }
  const entry = found.record
  const round = await db.rounds.get(entry.roundId)
  const event = round ? await db.events.get(round.eventId) : undefined
  // How far the cup is, counted among its brews on this phone.
  const pours = await db.brews.where('teamId').equals(entry.teamId).filter(brew => !brew.deletedAt && brew.context.kind === 'entry' && brew.context.refId === entry.id).count()
  const signing = round ? await db.signoffs.where('roundId').equals(round.id).filter(signoff => signoff.sync.state === 'pending').count() : 0
  const pourText = round ? `${pours} of ${round.poursPerCup} pours measured, ${round.readingsPerPour} readings each` : ''
  return {
    ...base,
    title: `Cup ${entry.code}${round ? ` · ${round.name}` : ''}`,
    detail: [event?.name, pourText].filter(Boolean).join(' · '),
    zoneId: round?.zoneId ?? event?.zoneId ?? null,
    closed: Boolean(round?.derived) || signing > 0,
    link: round ? { to: `/field/rounds/${round.id}`, text: 'Round board' } : undefined,
  }
}

export function useBrewContext(context: Ref<BrewContext>) {
  return useLiveQuery(() => describeContext(context.value), quick, context)
}

/** Everything a brew can be measured for on this team, for the picker: the crew's house recipes first. */
export async function contextChoices(teamId: string): Promise<BrewContextView[]> {
  const open = <T extends { deletedAt: string | null }>(rows: T[]): T[] => rows.filter(row => !row.deletedAt)
  const [recipes, lots, entries, marks] = await Promise.all([
    db.recipes.where('teamId').equals(teamId).toArray(),
    db.lots.where('teamId').equals(teamId).toArray(),
    db.entries.where('teamId').equals(teamId).toArray(),
    db.houseRecipes.where('teamId').equals(teamId).toArray(),
  ])
  const house = houseRecipes(marks, recipes)
  const houseOf = new Map([...house].map(([method, recipe]) => [recipe.id, method]))
  const found: ContextRecord[] = [
    ...open(recipes).filter(record => !record.retired).map(record => ({ kind: 'recipe' as const, record })),
    ...open(lots).map(record => ({ kind: 'lot' as const, record })),
    ...open(entries).map(record => ({ kind: 'entry' as const, record })),
  ]
  const views = (await Promise.all(found.map(describeRecord))).map(view => ({ ...view, house: view.kind === 'recipe' && view.refId ? houseOf.get(view.refId) : undefined }))
  const rank = (view: BrewContextView): number => (view.house ? methodOrder.indexOf(view.house) : 10)
  const sorted = views.filter(view => !view.closed).sort((a, b) => rank(a) - rank(b) || a.kind.localeCompare(b.kind) || a.title.localeCompare(b.title))
  const first = sorted.filter(view => view.house)
  return [...first, quick, ...sorted.filter(view => !view.house)]
}
