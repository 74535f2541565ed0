import type { Ref } from 'vue'
import type { LocalRecord } from '../db/database'
import type { BrewForm, ContextKind } from './useBrewForm'
import { cuppingDose } from '../../shared/brewing'
import { db } from '../db/database'
import { formatDuration, numberText } from '../forms/numbers'
import { capital } from '../forms/words'
import { useLiveQuery } from './useLiveQuery'

/** What a brew was measured for, in words, with what it brings to the form. */
export interface BrewContextView {
  kind: ContextKind
  title: string
  detail: string
  /** The record itself: the recipe, the lot or the event entry. */
  record: LocalRecord | null
  /** An event entry is judged against the event's zone. */
  zoneId: string | null
  /** An entry in a signed-off round takes no more brews. */
  closed: boolean
}

const quick: BrewContextView = { kind: 'quick', title: 'Quick brew', detail: 'Not tied to a recipe, a lot or an event.', record: null, zoneId: null, closed: false }

const tables = { recipe: db.recipes, lot: db.lots, entry: db.entries } as const

/** Resolves a context from the phone's store; a record not (or no longer) here reads as missing. */
export async function describeContext(kind: ContextKind, refId: string | null): Promise<BrewContextView> {
  if (kind === 'quick' || !refId)
    return quick
  const record = await tables[kind].get(refId)
  if (!record || record.deletedAt)
    return { ...quick, kind, title: 'Not on this phone', detail: 'The record this brew belongs to has not synced here, or was deleted.' }
  return describeRecord(kind, record)
}

/** A recipe, lot or event entry already read, in words, with what it points at (trip, round, event). */
async function describeRecord(kind: Exclude<ContextKind, 'quick'>, record: LocalRecord): Promise<BrewContextView> {
  if (kind === 'recipe')
    return { ...quick, kind, record, title: `Recipe: ${record.name}`, detail: `${capital(String(record.method))} · ${record.dose} g in ${record.waterMass} g of water` }
  if (kind === 'lot') {
    const trip = typeof record.tripId === 'string' ? await db.trips.get(record.tripId) : undefined
    // SCA cupping protocol: 8.25 g ± 0.25 g of coffee per 150 mL of water.
    const bowl = cuppingDose(150)
    const cupping = `cupping bowl: ${bowl.dose.toFixed(2)} g (${bowl.min.toFixed(2)}–${bowl.max.toFixed(2)}) per 150 mL`
    return { ...quick, kind, record, title: `Lot: ${record.farm}`, detail: [record.region, record.variety, record.process, trip?.name, cupping].filter(Boolean).join(' · ') }
  }
  const round = await db.rounds.get(String(record.roundId))
  const event = round ? await db.events.get(String(round.eventId)) : undefined
  return {
    ...quick,
    kind,
    record,
    title: `Cup ${record.code}${round ? ` · ${round.name}` : ''}`,
    detail: event ? String(event.name) : '',
    zoneId: typeof event?.zoneId === 'string' ? event.zoneId : null,
    closed: Boolean(round?.signedOffAt),
  }
}

export function useBrewContext(context: Ref<{ kind: ContextKind, refId: string | null }>) {
  return useLiveQuery(() => describeContext(context.value.kind, context.value.refId), quick, context)
}

/** Everything a brew can be measured for on this team, for the picker. */
export async function contextChoices(teamId: string): Promise<BrewContextView[]> {
  const kinds = Object.keys(tables) as (keyof typeof tables)[]
  const found = await Promise.all(kinds.map(kind => tables[kind].where('teamId').equals(teamId).filter(row => !row.deletedAt).toArray()))
  const views = await Promise.all(kinds.flatMap((kind, index) => found[index]!.map(record => describeRecord(kind, record))))
  return [quick, ...views.filter(view => !view.closed).sort((a, b) => a.kind.localeCompare(b.kind) || a.title.localeCompare(b.title))]
}

/** What choosing a context fills in: a recipe's method and settings, a cupping's immersion. */
export function contextDefaults(view: BrewContextView): Partial<BrewForm> {
  const record = view.record
  if (view.kind === 'recipe' && record) {
    return {
      method: record.method as BrewForm['method'],
      waterMass: numberText(record.waterMass),
      grindSetting: String(record.grindSetting ?? ''),
      contactTime: formatDuration(record.contactTimeSeconds as number | null),
      waterTemperature: numberText(record.waterTemperatureC),
    }
  }
  if (view.kind === 'lot')
    return { method: 'immersion' }
  return {}
}
