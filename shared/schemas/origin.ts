import { z } from 'zod'
import { freeText, IdSchema, nameText } from './primitives'

// What a green-coffee buyer records at origin: the lot's grading and offer, the cupping table with
// its protocol, the team's score sheets and each taster's scores, and the photos. Every field of a
// lot added here has a default, so lots written before these fields existed still read.

const id = IdSchema
const day = z.iso.date({ error: 'must be a date (YYYY-MM-DD)' })
const when = z.iso.datetime({ offset: true, error: 'must be a date and time' })
const count = (max: number) => z.number().int('must be a whole number').nonnegative('cannot be negative').max(max, `must be at most ${max}`)

/** How a buyer settles on a lot, in the team's own words: still open, claim it, keep it on a shortlist, or pass. */
export const LotDecisionSchema = z.enum(['open', 'claim', 'shortlist', 'pass'])
export type LotDecision = z.infer<typeof LotDecisionSchema>

/** What an asking price is counted per. */
export const PriceUnitSchema = z.enum(['kg', 'lb', 'bag', 'lot'])
export type PriceUnit = z.infer<typeof PriceUnitSchema>

/** The lot's fields beyond farm, region, variety, process, moisture, size and price (entities.ts). */
export const lotGradingFields = {
  /** The seller's own code for the lot, as on the offer list. */
  reference: freeText(60).default(''),
  /** Metres above sea level; a single altitude has no upper end. */
  altitudeMinM: z.number().min(0, 'cannot be negative').max(6000, 'must be at most 6000 m').nullable().default(null),
  altitudeMaxM: z.number().min(0, 'cannot be negative').max(6000, 'must be at most 6000 m').nullable().default(null),
  /** The crop, as the seller writes it ("2025/26 main crop"). */
  harvest: freeText(60).default(''),
  bags: count(100_000).nullable().default(null),
  /** Kilograms of green coffee in one bag. */
  bagKg: z.number().positive('must be more than zero').max(1000, 'must be at most 1000 kg').nullable().default(null),
  /** Water activity (aw) of the green, 0 to 1. */
  waterActivity: z.number().min(0, 'cannot be negative').max(1, 'must be at most 1').nullable().default(null),
  /** Free-settled density of the green, grams per litre. */
  densityGPerL: z.number().positive('must be more than zero').max(2000, 'must be at most 2000 g/L').nullable().default(null),
  /** Screen size as graded ("16/18", "15+"). */
  screenSize: freeText(20).default(''),
  /** Defects counted in a green sample of `defectSampleG` grams. */
  primaryDefects: count(10_000).nullable().default(null),
  secondaryDefects: count(10_000).nullable().default(null),
  defectSampleG: z.number().positive('must be more than zero').max(10_000, 'must be at most 10000 g').nullable().default(null),
  priceUnit: PriceUnitSchema.default('kg'),
  decision: LotDecisionSchema.default('open'),
  decisionReason: freeText(500).default(''),
}

/**
 * One cupping table: the lots on it and the protocol every bowl follows. The ratio starts at the
 * SCA cupping protocol's 8.25 g per 150 mL; water temperature and grind are the table's own.
 */
export const CuppingTableDataSchema = z.strictObject({
  tripId: id.nullable().default(null),
  heldOn: day,
  place: freeText(120).default(''),
  lotIds: z.array(id).min(1, 'must hold at least one lot').max(24, 'must hold at most 24 lots'),
  /** Coffee per bowl, grams, and water per bowl, mL. */
  doseG: z.number().positive('must be more than zero').max(100, 'must be at most 100 g').default(8.25),
  waterMl: z.number().positive('must be more than zero').max(1000, 'must be at most 1000 mL').default(150),
  waterTemperatureC: z.number().min(0, 'cannot be below 0 °C').max(100, 'cannot be above 100 °C').nullable().default(null),
  grind: freeText(60).default(''),
  bowlsPerLot: z.number().int('must be a whole number').min(1, 'must be at least 1').max(10, 'must be at most 10').default(5),
  /** The team's score sheet for this table; null for the built-in trade attributes. */
  scoreSheetId: id.nullable().default(null),
  notes: freeText(2000).default(''),
}).check((ctx) => {
  if (new Set(ctx.value.lotIds).size !== ctx.value.lotIds.length)
    ctx.issues.push({ code: 'custom', path: ['lotIds'], input: ctx.value.lotIds, message: 'names a lot twice' })
})

export const ScoreAttributeSchema = z.strictObject({
  /** A short key that scores refer to; stays when the label is reworded. */
  key: z.string().regex(/^[a-z][a-z0-9-]{0,39}$/, 'must be a short key of lower-case letters, digits and dashes'),
  label: nameText(60),
  /** This attribute's own scale, where it differs from the sheet's (a cup count scored in steps of 2). */
  scaleMin: z.number().min(0, 'cannot be negative').max(100, 'must be at most 100').nullable().default(null),
  scaleMax: z.number().positive('must be more than zero').max(100, 'must be at most 100').nullable().default(null),
  step: z.number().positive('must be more than zero').max(10, 'must be at most 10').nullable().default(null),
})

/** A team's own score sheet: the attributes, the scale each is scored on, and how the total is formed. */
export const ScoreSheetDataSchema = z.strictObject({
  name: nameText(120),
  attributes: z.array(ScoreAttributeSchema).min(1, 'needs at least one attribute').max(16, 'must hold at most 16 attributes'),
  scaleMin: z.number().min(0, 'cannot be negative').max(100, 'must be at most 100').default(6),
  scaleMax: z.number().positive('must be more than zero').max(100, 'must be at most 100').default(10),
  step: z.number().positive('must be more than zero').max(10, 'must be at most 10').default(0.25),
  /** The total: the attributes' sum, or their mean. */
  total: z.enum(['sum', 'mean']).default('sum'),
  notes: freeText(2000).default(''),
}).check((ctx) => {
  const keys = ctx.value.attributes.map(attribute => attribute.key)
  if (new Set(keys).size !== keys.length)
    ctx.issues.push({ code: 'custom', path: ['attributes'], input: keys, message: 'names an attribute twice' })
  if (ctx.value.scaleMax <= ctx.value.scaleMin)
    ctx.issues.push({ code: 'custom', path: ['scaleMax'], input: ctx.value.scaleMax, message: 'must be above the lowest score' })
})

/**
 * One taster's scores of one lot on one table. The taster is the person who records it; its id
 * comes from the table, the lot and the taster (scoreIdOf), so a taster has one score per lot.
 */
export const ScoreDataSchema = z.strictObject({
  tableId: id,
  lotId: id,
  values: z.array(z.strictObject({ attribute: ScoreAttributeSchema.shape.key, value: z.number().min(0, 'cannot be negative').max(100, 'must be at most 100') })).max(16, 'must hold at most 16 scores'),
  /** Points taken off the total for defective cups. */
  deduction: z.number().min(0, 'cannot be negative').max(100, 'must be at most 100').default(0),
  notes: freeText(1000).default(''),
})

export const PhotoTypeSchema = z.enum(['image/jpeg', 'image/png', 'image/webp'])
/** Largest photo the server takes, in bytes (8 MiB). */
export const maxPhotoBytes = 8 * 1024 * 1024

/** A photo's record; its bytes travel apart, by the same id (PUT /teams/:teamId/photos/:id). */
export const PhotoDataSchema = z.strictObject({
  /** What it shows: the green of a lot, a cupping bowl, or a document (a contract, a grading sheet). */
  subject: z.enum(['lot', 'bowl', 'document']),
  tripId: id.nullable().default(null),
  lotId: id.nullable().default(null),
  /** The bowl (a brew) it shows. */
  brewId: id.nullable().default(null),
  caption: freeText(200).default(''),
  contentType: PhotoTypeSchema,
  sizeBytes: z.number().int().positive('must be more than zero').max(maxPhotoBytes, 'must be at most 8 MB'),
  width: z.number().int().positive().max(20_000).nullable().default(null),
  height: z.number().int().positive().max(20_000).nullable().default(null),
  takenAt: when,
}).check((ctx) => {
  const { subject, tripId, lotId, brewId } = ctx.value
  if (subject === 'bowl' && !brewId)
    ctx.issues.push({ code: 'custom', path: ['brewId'], input: brewId, message: 'must name the bowl a bowl photo shows' })
  if (!tripId && !lotId && !brewId)
    ctx.issues.push({ code: 'custom', path: ['lotId'], input: lotId, message: 'must name the lot, bowl or trip the photo belongs to' })
})

/** The answer to PUT /teams/:teamId/photos/:photoId: 201 when stored now, 200 when it was already. */
export const PhotoUploadResponseSchema = z.object({
  photo: z.object({ id: z.string(), contentType: PhotoTypeSchema, sizeBytes: z.number().int(), created: z.boolean() }),
})
export type PhotoUploadResponse = z.infer<typeof PhotoUploadResponseSchema>
