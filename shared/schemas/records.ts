import type { EntityData, EntityName } from './entities'
import { z } from 'zod'
import { entityDataSchemas } from './entities'

// A stored record is one entity's data plus the envelope every record shares, and what the server
// derived from the data. Phones and server read records through these shapes.

/**
 * One line of a record's history, written by the server as it applies a change: who, when, at which
 * rev, and each field's value before and after. `result` holds a brew's strength and yield before
 * and after when the change moved them; `readings` the count of readings when some were added.
 */
export const HistoryEntrySchema = z.object({
  rev: z.number().int(),
  at: z.string(),
  by: z.string(),
  op: z.enum(['edit', 'delete', 'restore']),
  changes: z.record(z.string(), z.object({ from: z.unknown(), to: z.unknown() })).default({}),
  reason: z.string().optional(),
})
export type HistoryEntry = z.infer<typeof HistoryEntrySchema>

/** Fields every stored record carries besides its data. */
export const RecordEnvelopeSchema = z.object({
  id: z.string(),
  teamId: z.string(),
  createdBy: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
  rev: z.number().int(),
  deletedAt: z.string().nullable(),
  /** The latest edits, deletes and restores, oldest first; older ones are kept on the server only. */
  history: z.array(HistoryEntrySchema).default([]),
  /** How many history entries the server holds in all (more than `history` once it is capped). */
  historyCount: z.number().int().nonnegative().default(0),
})
export type RecordEnvelope = z.infer<typeof RecordEnvelopeSchema>

const CalibrationFitSchema = z.object({
  slope: z.number(),
  intercept: z.number(),
  n: z.number(),
  rSquared: z.number(),
  residualSd: z.number(),
  slopeSe: z.number(),
  interceptSe: z.number(),
  meanConcentration: z.number(),
  meanReading: z.number(),
  sxx: z.number(),
  degreesOfFreedom: z.number(),
})

/** What the server computes from a record's data and sends with it; null for most entities. */
export const derivedSchemas = {
  instrument: z.null(),
  calibration: z.object({ fit: CalibrationFitSchema }),
  brew: z.object({
    tdsPercent: z.number().nullable(),
    yieldPercent: z.number().nullable(),
    missing: z.array(z.string()).optional(),
    problem: z.object({ field: z.string(), message: z.string() }).optional(),
  }),
  reading: z.null(),
  event: z.null(),
  /** A round is frozen once signed off: by whom and when, set by the server alone. */
  round: z.object({ signedOffAt: z.string(), signedOffBy: z.string() }),
  entry: z.null(),
  trip: z.null(),
  lot: z.null(),
  recipe: z.null(),
  zone: z.null(),
  zoneDefault: z.null(),
  signoff: z.null(),
  zeroCheck: z.null(),
  cuppingTable: z.null(),
  scoreSheet: z.null(),
  score: z.null(),
  photo: z.null(),
  recipeVersion: z.null(),
  houseRecipe: z.null(),
  dialIn: z.null(),
} as const satisfies Record<EntityName, z.ZodType>

export type EntityDerived<E extends EntityName> = z.infer<(typeof derivedSchemas)[E]>

/** A record as the server keeps and sends it: data, envelope and what was derived. */
export type EntityRecord<E extends EntityName> = EntityData<E> & RecordEnvelope & { derived: EntityDerived<E> | null }
export type AnyRecord = { [E in EntityName]: EntityRecord<E> }[EntityName]

/** The keys that are not the record's own data. */
export const envelopeKeys: ReadonlySet<string> = new Set([...Object.keys(RecordEnvelopeSchema.shape), 'derived'])

const recordSchemas = new Map<EntityName, z.ZodType>()

/**
 * The shape of a stored record of an entity, for reading what the server sends. Fields this version
 * does not know are left out rather than refused (a newer server may have added some), and fields
 * it added later get their defaults.
 */
export function recordSchemaOf<E extends EntityName>(entity: E): z.ZodType<EntityRecord<E>> {
  let schema = recordSchemas.get(entity)
  if (!schema) {
    const shape: z.core.$ZodShape = entityDataSchemas[entity].shape
    const derived: z.ZodType = derivedSchemas[entity]
    schema = RecordEnvelopeSchema.extend(shape).extend({ derived: derived.nullable().catch(null).default(null) })
    recordSchemas.set(entity, schema)
  }
  // The schema is built from EntityData<E>'s shape plus the envelope, which is EntityRecord<E>.
  return schema as z.ZodType<EntityRecord<E>>
}
