import type { z } from 'zod'
import type { EntityName } from '../../shared/schemas/entities'
import { entityDataSchemas } from '../../shared/schemas/entities'
import { brews, calibrations, entries, events, instruments, lots, readings, recipes, rounds, trips, zones } from '../db/schema'

/** The columns every record table shares (the extra reference columns differ per table). */
export type RecordTable = typeof instruments

export interface EntityDefinition {
  table: RecordTable
  schema: z.ZodType<Record<string, unknown>>
  /** Readings are append-only: never edited, never deleted. */
  appendOnly?: boolean
  /** The indexed reference columns of the table, from the record's data. */
  references: (data: Record<string, unknown>) => Record<string, unknown>
  /** Records this one points at, which must exist in the same team: [entity, id]. */
  parents: (data: Record<string, unknown>) => [EntityName, string][]
}

const str = (value: unknown): string | null => (typeof value === 'string' ? value : null)
const none = (): Record<string, unknown> => ({})
const noParents = (): [EntityName, string][] => []

export const registry: Record<EntityName, EntityDefinition> = {
  instrument: { table: instruments, schema: entityDataSchemas.instrument, references: none, parents: noParents },
  calibration: {
    table: calibrations as unknown as RecordTable,
    schema: entityDataSchemas.calibration,
    references: data => ({ instrumentId: str(data.instrumentId) }),
    parents: data => [['instrument', data.instrumentId as string]],
  },
  brew: {
    table: brews as unknown as RecordTable,
    schema: entityDataSchemas.brew,
    references: data => ({ contextRefId: str((data.context as { refId?: unknown })?.refId), calibrationId: str(data.calibrationId) }),
    parents: (data) => {
      const found: [EntityName, string][] = []
      const context = data.context as { kind: string, refId: string | null }
      if (context.refId && (context.kind === 'entry' || context.kind === 'lot' || context.kind === 'recipe'))
        found.push([context.kind, context.refId])
      if (typeof data.calibrationId === 'string')
        found.push(['calibration', data.calibrationId])
      return found
    },
  },
  reading: {
    table: readings as unknown as RecordTable,
    schema: entityDataSchemas.reading,
    appendOnly: true,
    references: data => ({ brewId: str(data.brewId) }),
    parents: data => [['brew', data.brewId as string]],
  },
  event: { table: events, schema: entityDataSchemas.event, references: none, parents: noParents },
  round: {
    table: rounds as unknown as RecordTable,
    schema: entityDataSchemas.round,
    references: data => ({ eventId: str(data.eventId) }),
    parents: data => [['event', data.eventId as string]],
  },
  entry: {
    table: entries as unknown as RecordTable,
    schema: entityDataSchemas.entry,
    references: data => ({ roundId: str(data.roundId) }),
    parents: data => [['round', data.roundId as string]],
  },
  trip: { table: trips, schema: entityDataSchemas.trip, references: none, parents: noParents },
  lot: {
    table: lots as unknown as RecordTable,
    schema: entityDataSchemas.lot,
    references: data => ({ tripId: str(data.tripId) }),
    parents: data => (typeof data.tripId === 'string' ? [['trip', data.tripId]] : []),
  },
  recipe: { table: recipes, schema: entityDataSchemas.recipe, references: none, parents: noParents },
  zone: { table: zones, schema: entityDataSchemas.zone, references: none, parents: noParents },
}
