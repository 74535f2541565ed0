import { z } from 'zod'

// Shapes of every input to the brewing core, for forms and API payloads. The functions in
// shared/brewing check the same limits again and name the field; these catch shape and type first.

const grams = (label: string) => z.number({ error: `${label} must be a number of grams.` }).positive(`${label} must be more than zero.`).max(100_000, `${label} is implausibly large.`)
const gramsOrZero = (label: string) => z.number({ error: `${label} must be a number of grams.` }).nonnegative(`${label} cannot be negative.`).max(100_000, `${label} is implausibly large.`)
const tdsPercent = z.number({ error: 'Strength must be a number.' }).positive('Strength must be more than zero.').lt(100, 'Strength must be below 100 %.')
const yieldPercent = z.number({ error: 'Extraction must be a number.' }).positive('Extraction must be more than zero.').lt(100, 'Extraction must be below 100 %.')
const retainedRatio = z.number({ error: 'LRR must be a number.' }).nonnegative('LRR cannot be negative.').max(10, 'An LRR above 10 g/g is not plausible.')

export const BrewMethodSchema = z.enum(['percolation', 'espresso', 'immersion'])
export const ReadingKindSchema = z.enum(['nD', 'brix', 'tds'])

export const CalibrationPointSchema = z.strictObject({
  concentration: z.number({ error: 'The concentration must be a number.' }),
  reading: z.number({ error: 'The reading must be a number.' }),
})
export const CalibrationPointsSchema = z.array(CalibrationPointSchema).min(2, 'A calibration needs at least two standards.').max(50, 'Use at most 50 standards.')

export const MassByDifferenceInputSchema = z.strictObject({ gross: gramsOrZero('The gross weight'), tare: gramsOrZero('The tare weight') })
export const DryDoseInputSchema = z.strictObject({ dose: grams('The dose'), moisturePercent: z.number().min(0).lt(100) })

export const PercolationYieldInputSchema = z.strictObject({ tdsPercent, beverageMass: grams('The beverage mass'), dose: grams('The dose') })
export const ImmersionYieldInputSchema = z.strictObject({ tdsPercent, waterMass: grams('The water mass'), dose: grams('The dose') })
export const DecantedYieldInputSchema = z.strictObject({ tdsPercent, beverageMass: grams('The beverage mass'), dose: grams('The dose'), retainedRatio })
export const BeverageFromWaterInputSchema = z.strictObject({ waterMass: grams('The water mass'), dose: grams('The dose'), retainedRatio })

export const ReadingsInputSchema = z.array(z.number({ error: 'Each reading must be a number.' })).min(1, 'Add at least one reading.').max(50, 'Use at most 50 readings of one sample.')
export const ZeroCheckInputSchema = z.strictObject({ reading: z.number(), kind: ReadingKindSchema, tolerance: z.number().positive().optional() })

export const YieldUncertaintyInputSchema = z.strictObject({
  method: BrewMethodSchema,
  tdsPercent,
  dose: grams('The dose'),
  beverageMass: grams('The beverage mass').optional(),
  waterMass: grams('The water mass').optional(),
  scaleResolution: z.number().positive('The scale resolution must be more than zero.').max(10),
  byDifference: z.boolean().optional(),
  repeatabilityTdsPercent: z.number().nonnegative('The repeatability cannot be negative.').max(5),
  readings: z.number().int().min(1).max(50).optional(),
  calibrationTdsPercent: z.number().nonnegative().max(5).optional(),
})

export const RangeSchema = z.strictObject({ min: z.number().positive(), max: z.number().positive() })
  .refine(range => range.max > range.min, { message: 'The upper limit must be above the lower one.', path: ['max'] })
export const ZoneSchema = z.strictObject({
  id: z.string().min(1).max(64),
  name: z.string().trim().min(1, 'Give the zone a name.').max(80),
  tdsPercent: RangeSchema,
  yieldPercent: RangeSchema,
  source: z.string().max(200).default('Team zone'),
})

export const RecipeInputSchema = z.strictObject({
  targetTdsPercent: tdsPercent,
  targetYieldPercent: yieldPercent,
  method: BrewMethodSchema,
  dose: grams('The dose').optional(),
  beverageMass: grams('The beverage mass').optional(),
  retainedRatio: retainedRatio.optional(),
}).refine(input => (input.dose === undefined) !== (input.beverageMass === undefined), { message: 'Give either the dose or the beverage mass wanted, not both.', path: ['dose'] })

export const CuppingInputSchema = z.strictObject({ waterMl: z.number().positive('The bowl\'s water volume must be more than zero.').max(1000) })
export const BrewRatioInputSchema = z.strictObject({ dose: grams('The dose'), waterMass: grams('The water mass') })

export type BrewMethod = z.infer<typeof BrewMethodSchema>
export type ReadingKind = z.infer<typeof ReadingKindSchema>
export type ZoneInput = z.infer<typeof ZoneSchema>
export type RecipeInputPayload = z.infer<typeof RecipeInputSchema>
