import { z } from 'zod'
import { BrewMethodSchema, CalibrationPointSchema, RangeSchema, ReadingKindSchema } from './brewing'

// What a phone may write for each kind of record. Derived values (a calibration's fit, a brew's
// strength and yield) are not here: the server computes them with shared/brewing.

const id = z.string().regex(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i, 'is not an id')
const text = (max: number) => z.string().trim().max(max, `must be at most ${max} characters`)
const name = z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters')
const grams = z.number().positive('must be more than zero').max(100_000)
const gramsOrZero = z.number().nonnegative('cannot be negative').max(100_000)
const when = z.iso.datetime({ offset: true, error: 'must be a date and time' })
const day = z.iso.date({ error: 'must be a date (YYYY-MM-DD)' })

export const InstrumentDataSchema = z.strictObject({
  label: name,
  readingKind: ReadingKindSchema,
  /** Smallest step the instrument shows, in its own unit. */
  resolution: z.number().positive().max(10),
  /** Standard deviation of one reading of one sample, in its own unit. */
  repeatability: z.number().nonnegative().max(10),
  brixFactor: z.number().positive().max(1.5).nullable().default(null),
  notes: text(2000).default(''),
})

export const CalibrationDataSchema = z.strictObject({
  instrumentId: id,
  /** What the standards' concentrations are in: sucrose °Brix or coffee %TDS. */
  standardUnit: z.enum(['brix', 'tds']),
  points: z.array(CalibrationPointSchema).min(2, 'needs at least two standards').max(50),
  zeroReading: z.number().nullable().default(null),
  temperatureC: z.number().min(0).max(60).nullable().default(null),
  active: z.boolean(),
  calibratedAt: when,
  notes: text(2000).default(''),
})

export const BrewContextSchema = z.strictObject({
  kind: z.enum(['quick', 'entry', 'lot', 'recipe']),
  refId: id.nullable().default(null),
})

export const BrewDataSchema = z.strictObject({
  context: BrewContextSchema,
  method: BrewMethodSchema,
  instrumentId: id.nullable().default(null),
  calibrationId: id.nullable().default(null),
  /** How readings become %TDS: the calibration, a °Brix factor, or readings already in %TDS. */
  strengthSource: z.enum(['calibration', 'brix-factor', 'direct']),
  brixFactor: z.number().positive().max(1.5).nullable().default(null),
  dose: grams.nullable().default(null),
  doseGross: gramsOrZero.nullable().default(null),
  doseTare: gramsOrZero.nullable().default(null),
  beverageMass: grams.nullable().default(null),
  beverageGross: gramsOrZero.nullable().default(null),
  beverageTare: gramsOrZero.nullable().default(null),
  waterMass: grams.nullable().default(null),
  retainedRatio: z.number().nonnegative().max(10).nullable().default(null),
  grindSetting: text(40).default(''),
  contactTimeSeconds: z.number().nonnegative().max(86_400).nullable().default(null),
  waterTemperatureC: z.number().min(0).max(100).nullable().default(null),
  notes: text(2000).default(''),
  brewedAt: when,
  /** Readings set aside (a misread, a smeared lens): kept on record, left out of the result. */
  excludedReadingIds: z.array(id).max(50, 'must hold at most 50 readings').default([]),
})

export const ReadingDataSchema = z.strictObject({
  brewId: id,
  value: z.number(),
  kind: ReadingKindSchema,
  temperatureC: z.number().min(0).max(60).nullable().default(null),
  instrumentId: id.nullable().default(null),
  calibrationId: id.nullable().default(null),
  takenAt: when,
})

export const EventDataSchema = z.strictObject({ name, venue: text(120).default(''), startsOn: day.nullable().default(null), endsOn: day.nullable().default(null), zoneId: text(64).default('us-drip') })
export const RoundDataSchema = z.strictObject({
  eventId: id,
  name,
  position: z.number().int().min(0).max(1000),
  /** Largest allowed distance from the target, per axis, before a cup is flagged. */
  toleranceTdsPercent: z.number().nonnegative().max(5).nullable().default(null),
  toleranceYieldPercent: z.number().nonnegative().max(20).nullable().default(null),
})
export const EntryDataSchema = z.strictObject({ roundId: id, code: z.string().trim().min(1).max(20), contestant: text(120).default(''), notes: text(2000).default('') })
export const TripDataSchema = z.strictObject({ name, origin: text(120).default(''), startsOn: day.nullable().default(null), endsOn: day.nullable().default(null), notes: text(2000).default('') })
export const LotDataSchema = z.strictObject({
  tripId: id.nullable().default(null),
  farm: name,
  region: text(120).default(''),
  variety: text(120).default(''),
  process: text(60).default(''),
  moisturePercent: z.number().min(0).lt(100).nullable().default(null),
  lotSizeKg: z.number().nonnegative().max(10_000_000).nullable().default(null),
  askingPrice: z.number().nonnegative().max(1_000_000).nullable().default(null),
  currency: z.string().regex(/^[A-Z]{3}$/, 'must be a three-letter currency code').nullable().default(null),
  notes: text(2000).default(''),
})
export const RecipeDataSchema = z.strictObject({
  name,
  method: BrewMethodSchema,
  dose: grams,
  waterMass: grams,
  targetTdsPercent: z.number().positive().lt(100).nullable().default(null),
  targetYieldPercent: z.number().positive().lt(100).nullable().default(null),
  grindSetting: text(40).default(''),
  contactTimeSeconds: z.number().nonnegative().max(86_400).nullable().default(null),
  waterTemperatureC: z.number().min(0).max(100).nullable().default(null),
  notes: text(2000).default(''),
})

/** A team's own target zone on the brewing control chart, beside the published presets. */
export const ZoneDataSchema = z.strictObject({
  name,
  tdsPercent: RangeSchema.refine(range => range.max < 100, { message: 'must be below 100 %', path: ['max'] }),
  yieldPercent: RangeSchema.refine(range => range.max < 100, { message: 'must be below 100 %', path: ['max'] }),
  notes: text(2000).default(''),
})

export const entityDataSchemas = {
  instrument: InstrumentDataSchema,
  calibration: CalibrationDataSchema,
  brew: BrewDataSchema,
  reading: ReadingDataSchema,
  event: EventDataSchema,
  round: RoundDataSchema,
  entry: EntryDataSchema,
  trip: TripDataSchema,
  lot: LotDataSchema,
  recipe: RecipeDataSchema,
  zone: ZoneDataSchema,
} as const

export type EntityName = keyof typeof entityDataSchemas
export const EntityNameSchema = z.enum(Object.keys(entityDataSchemas) as [EntityName, ...EntityName[]])
export type EntityData<E extends EntityName> = z.infer<(typeof entityDataSchemas)[E]>

/** Fields every stored record carries besides its data. */
export const RecordEnvelopeSchema = z.object({
  id,
  teamId: id,
  createdBy: id,
  createdAt: z.string(),
  updatedAt: z.string(),
  rev: z.number().int(),
  deletedAt: z.string().nullable(),
})
export type RecordEnvelope = z.infer<typeof RecordEnvelopeSchema>

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

export const MutationSchema = z.strictObject({
  mutationId: id,
  entity: EntityNameSchema,
  /** put: create or edit; delete: leave a tombstone; restore: bring a tombstoned record back. */
  op: z.enum(['put', 'delete', 'restore']),
  id,
  teamId: id,
  data: z.unknown().optional(),
  /** The server rev the phone's copy was based on; null for a record new on the phone. */
  baseRev: z.number().int().nonnegative().nullable(),
  /** Why a record was changed or deleted; a teammate's brew is only corrected with one. */
  reason: z.string().trim().max(500, 'must be at most 500 characters').optional(),
})
export type Mutation = z.infer<typeof MutationSchema>

export const maxMutationsPerPush = 200

export const PushBodySchema = z.strictObject({
  clientId: id,
  // Each mutation is checked on its own so one bad one does not sink the batch.
  mutations: z.array(z.unknown()).min(1, 'must hold at least one mutation').max(maxMutationsPerPush, `must hold at most ${maxMutationsPerPush} mutations`),
})

export const MutationResultSchema = z.object({
  mutationId: z.string(),
  status: z.enum(['applied', 'conflict', 'rejected']),
  rev: z.number().int().optional(),
  reason: z.string().optional(),
  server: z.record(z.string(), z.unknown()).optional(),
})
export type MutationResult = z.infer<typeof MutationResultSchema>
export const PushResponseSchema = z.object({ results: z.array(MutationResultSchema) })

export const PullQuerySchema = z.object({
  teamId: id,
  since: z.coerce.number().int().nonnegative().default(0),
  limit: z.coerce.number().int().min(1).max(1000).default(500),
})
export const ChangeSchema = z.object({ entity: EntityNameSchema, id: z.string(), rev: z.number().int(), op: z.enum(['put', 'delete']), data: z.record(z.string(), z.unknown()) })
export type Change = z.infer<typeof ChangeSchema>
export const PullResponseSchema = z.object({ changes: z.array(ChangeSchema), cursor: z.number().int(), hasMore: z.boolean() })
