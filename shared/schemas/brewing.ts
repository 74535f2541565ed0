import { z } from 'zod'

// Shapes the brewing core's inputs take inside records (shared/schemas/entities.ts). The functions
// in shared/brewing check the same limits again and name the field.

export const BrewMethodSchema = z.enum(['percolation', 'espresso', 'immersion'])
export const ReadingKindSchema = z.enum(['nD', 'brix', 'tds'])

export const CalibrationPointSchema = z.strictObject({
  concentration: z.number({ error: 'The concentration must be a number.' }),
  reading: z.number({ error: 'The reading must be a number.' }),
})

export const RangeSchema = z.strictObject({ min: z.number().positive(), max: z.number().positive() })
  .refine(range => range.max > range.min, { message: 'The upper limit must be above the lower one.', path: ['max'] })
