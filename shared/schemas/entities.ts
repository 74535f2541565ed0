import { z } from 'zod'
import { readingRanges } from '../brewing/readings'
import { BrewMethodSchema, CalibrationPointSchema, RangeSchema, ReadingKindSchema } from './brewing'
import { EntryDataSchema, EventDataSchema, RoundDataSchema, SignoffDataSchema, ZeroCheckDataSchema } from './competition'
import { CuppingTableDataSchema, lotGradingFields, PhotoDataSchema, ScoreDataSchema, ScoreSheetDataSchema } from './origin'
import { freeText, IdSchema, nameText } from './primitives'

// What a phone may write for each kind of record. Derived values (a calibration's fit, a brew's
// strength and yield) are not here: the server computes them with shared/brewing.

export { EntryDataSchema, EventDataSchema, RoundDataSchema, SignoffDataSchema, ZeroCheckDataSchema }

const id = IdSchema
const name = nameText(120)
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
  notes: freeText(2000).default(''),
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
  notes: freeText(2000).default(''),
})

export const ContextKindSchema = z.enum(['quick', 'entry', 'lot', 'recipe'])
export type ContextKind = z.infer<typeof ContextKindSchema>

export const BrewContextSchema = z.strictObject({
  kind: ContextKindSchema,
  refId: id.nullable().default(null),
  /**
   * The cupping table a lot's bowl was brewed on (kind 'lot' only). Optional rather than defaulted,
   * so that every context written as { kind, refId } stays a BrewContext.
   */
  tableId: id.nullable().optional(),
  // Optional rather than defaulted, so every `{ kind, refId }` written before them still type-checks.
  /** The recipe version a recipe brew followed (recipeVersion). */
  versionId: id.nullable().optional(),
  /** The dial-in session this brew is an attempt of (dialIn). */
  sessionId: id.nullable().optional(),
})
export type BrewContext = z.infer<typeof BrewContextSchema>

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
  grindSetting: freeText(40).default(''),
  contactTimeSeconds: z.number().nonnegative().max(86_400).nullable().default(null),
  waterTemperatureC: z.number().min(0).max(100).nullable().default(null),
  notes: freeText(2000).default(''),
  brewedAt: when,
  /** Readings set aside (a misread, a smeared lens): kept on record, left out of the result. */
  excludedReadingIds: z.array(id).max(50, 'must hold at most 50 readings').default([]),
  /** For an attempt of a dial-in session: what changed since the attempt before it. */
  changeNote: freeText(200).default(''),
})

/** A reading is bounded by its kind: no refractometer shows nD 5.67 or −3 %TDS (readingRanges). */
export const ReadingDataSchema = z.strictObject({
  brewId: id,
  value: z.number(),
  kind: ReadingKindSchema,
  temperatureC: z.number().min(0).max(60).nullable().default(null),
  instrumentId: id.nullable().default(null),
  calibrationId: id.nullable().default(null),
  takenAt: when,
}).check((ctx) => {
  const range = readingRanges[ctx.value.kind] as (typeof readingRanges)[keyof typeof readingRanges] | undefined
  if (range && !(ctx.value.value >= range.min && ctx.value.value <= range.max))
    ctx.issues.push({ code: 'custom', path: ['value'], input: ctx.value.value, message: `must be a reading from ${range.min} to ${range.max} in ${ctx.value.kind}` })
})

export const TripDataSchema = z.strictObject({ name, origin: freeText(120).default(''), startsOn: day.nullable().default(null), endsOn: day.nullable().default(null), notes: freeText(2000).default('') })
export const LotDataSchema = z.strictObject({
  tripId: id.nullable().default(null),
  farm: name,
  region: freeText(120).default(''),
  variety: freeText(120).default(''),
  process: freeText(60).default(''),
  moisturePercent: z.number().min(0, 'cannot be negative').lt(100, 'must be below 100 %').nullable().default(null),
  lotSizeKg: z.number().nonnegative('cannot be negative').max(10_000_000, 'must be at most 10,000,000 kg').nullable().default(null),
  askingPrice: z.number().nonnegative('cannot be negative').max(1_000_000, 'must be at most 1,000,000').nullable().default(null),
  currency: z.string().regex(/^[A-Z]{3}$/, 'must be a three-letter currency code').nullable().default(null),
  notes: freeText(2000).default(''),
  ...lotGradingFields,
}).check((ctx) => {
  const { altitudeMinM, altitudeMaxM } = ctx.value
  if (altitudeMinM !== null && altitudeMaxM !== null && altitudeMaxM < altitudeMinM)
    ctx.issues.push({ code: 'custom', path: ['altitudeMaxM'], input: altitudeMaxM, message: 'must not be below the lower altitude' })
})
const recipeFields = {
  name,
  method: BrewMethodSchema,
  dose: grams,
  /** Grams of brew water; none for espresso, whose water is never weighed. */
  waterMass: grams.nullable().default(null),
  targetTdsPercent: z.number().positive().lt(100).nullable().default(null),
  targetYieldPercent: z.number().positive().lt(100).nullable().default(null),
  grindSetting: freeText(40).default(''),
  /** Contact time; for espresso the shot time aimed at. */
  contactTimeSeconds: z.number().nonnegative().max(86_400).nullable().default(null),
  waterTemperatureC: z.number().min(0).max(100).nullable().default(null),
  notes: freeText(2000).default(''),
  /** Grams of beverage aimed at (an espresso's target beverage mass). */
  beverageMass: grams.nullable().default(null),
  /** LRR (g/g) the recipe counts on between water and beverage; null: the method's common-practice one. */
  retainedRatio: z.number().nonnegative().max(10).nullable().default(null),
  /** How far the shot time may stray from the target, ± seconds. */
  timeToleranceSeconds: z.number().nonnegative().max(600).nullable().default(null),
  /** The target zone (a preset or a team zone); null: the team's default for the method's family. */
  zoneId: freeText(64).nullable().default(null),
  /** A retired recipe stays on record for its brews but is no longer offered. */
  retired: z.boolean().default(false),
}

/** An espresso is set by its beverage; the other methods by their water or their beverage. */
function checkRecipeMasses(ctx: z.core.ParsePayload<{ method: string, waterMass: number | null, beverageMass: number | null }>): void {
  const { method, waterMass, beverageMass } = ctx.value
  if (method === 'espresso' && beverageMass === null)
    ctx.issues.push({ code: 'custom', path: ['beverageMass'], input: beverageMass, message: 'must be given for an espresso (the target beverage mass)' })
  else if (method !== 'espresso' && waterMass === null && beverageMass === null)
    ctx.issues.push({ code: 'custom', path: ['waterMass'], input: waterMass, message: 'must be given, or the beverage aimed at' })
}

/** A recipe's settings as each of its versions keeps them whole. */
export const RecipeSettingsSchema = z.strictObject(recipeFields).check(checkRecipeMasses)
export type RecipeSettings = z.infer<typeof RecipeSettingsSchema>

/** A recipe: its current settings, always those of the version it names (the server checks). */
export const RecipeDataSchema = z.strictObject({ ...recipeFields, versionId: id.nullable().default(null) }).check(checkRecipeMasses)

/** A team's own target zone on the brewing control chart, beside the published presets. */
export const ZoneDataSchema = z.strictObject({
  name,
  tdsPercent: RangeSchema.refine(range => range.max < 100, { message: 'must be below 100 %', path: ['max'] }),
  yieldPercent: RangeSchema.refine(range => range.max < 100, { message: 'must be below 100 %', path: ['max'] }),
  notes: freeText(2000).default(''),
})

/**
 * The team's default zone for a family of brews, for brews whose context names none. A lead or an
 * owner sets it; each choice is a record of its own, and the latest one stands.
 */
export const ZoneDefaultDataSchema = z.strictObject({
  family: z.enum(['filter', 'espresso']),
  zoneId: nameText(64),
})

/**
 * One version of a recipe, never changed once recorded: its settings whole, its number, the version
 * it changed and why. Who and when are its record's author and creation time.
 */
export const RecipeVersionDataSchema = z.strictObject({
  recipeId: id,
  number: z.number().int().min(1).max(100_000),
  /** The version this one changed; null for a recipe's first. */
  basedOnId: id.nullable().default(null),
  reason: nameText(300),
  settings: RecipeSettingsSchema,
  /** The dial-in attempt (a brew) whose numbers became this version, when one did. */
  fromBrewId: id.nullable().default(null),
})

/**
 * The crew's house recipe for a method, marked by a lead or an owner; each mark is a record of its
 * own and the latest stands. A null recipe clears the mark.
 */
export const HouseRecipeDataSchema = z.strictObject({
  method: BrewMethodSchema,
  recipeId: id.nullable(),
})

/** A dial-in session: a recipe (or a blank start), where, and with what equipment. */
export const DialInDataSchema = z.strictObject({
  recipeId: id.nullable().default(null),
  method: BrewMethodSchema,
  place: nameText(120),
  grinder: freeText(120).default(''),
  water: freeText(120).default(''),
  /** The target zone of a blank start (a recipe's own zone judges the attempts of a recipe). */
  zoneId: freeText(64).nullable().default(null),
  startedAt: when,
  notes: freeText(2000).default(''),
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
  zoneDefault: ZoneDefaultDataSchema,
  signoff: SignoffDataSchema,
  zeroCheck: ZeroCheckDataSchema,
  cuppingTable: CuppingTableDataSchema,
  scoreSheet: ScoreSheetDataSchema,
  score: ScoreDataSchema,
  photo: PhotoDataSchema,
  recipeVersion: RecipeVersionDataSchema,
  houseRecipe: HouseRecipeDataSchema,
  dialIn: DialInDataSchema,
} as const

export type EntityName = keyof typeof entityDataSchemas
export const entityNames = Object.keys(entityDataSchemas) as EntityName[]
export const EntityNameSchema = z.enum(entityNames as [EntityName, ...EntityName[]])
/** The fields of a record of an entity, as its phone writes them (defaults filled in). */
export type EntityData<E extends EntityName> = z.infer<(typeof entityDataSchemas)[E]>
/** The same fields as they may be written: those with a default can be left out. */
export type EntityDataInput<E extends EntityName> = z.input<(typeof entityDataSchemas)[E]>
