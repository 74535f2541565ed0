import { describe, expect, it } from 'vitest'
import { CalibrationPointsSchema, PercolationYieldInputSchema, RecipeInputSchema, YieldUncertaintyInputSchema, ZoneSchema } from '../../shared/schemas/brewing'

describe('brewing input schemas', () => {
  it('accept a pour-over and refuse an unknown field, naming it', () => {
    expect(PercolationYieldInputSchema.parse({ tdsPercent: 1.35, beverageMass: 240, dose: 15 })).toEqual({ tdsPercent: 1.35, beverageMass: 240, dose: 15 })
    const result = PercolationYieldInputSchema.safeParse({ tdsPercent: 1.35, beverageMass: 240, dose: 15, yieldPercent: 21.6 })
    expect(result.success).toBe(false)
    expect(JSON.stringify(result.error?.issues)).toContain('yieldPercent')
  })

  it('refuse a string where a number belongs, at that path', () => {
    const result = PercolationYieldInputSchema.safeParse({ tdsPercent: '1.35', beverageMass: 240, dose: 15 })
    expect(result.error?.issues[0]?.path).toEqual(['tdsPercent'])
  })

  it('refuse infinite numbers', () => {
    expect(PercolationYieldInputSchema.safeParse({ tdsPercent: 1.35, beverageMass: Number.POSITIVE_INFINITY, dose: 15 }).success).toBe(false)
  })

  it('need two calibration standards', () => {
    expect(CalibrationPointsSchema.safeParse([{ concentration: 0, reading: 1.333 }]).success).toBe(false)
  })

  it('check a zone\'s limits are the right way round', () => {
    const result = ZoneSchema.safeParse({ id: 'z', name: 'Z', tdsPercent: { min: 1.4, max: 1.2 }, yieldPercent: { min: 18, max: 22 } })
    expect(result.error?.issues[0]?.path).toEqual(['tdsPercent', 'max'])
  })

  it('ask for exactly one of dose and beverage in a recipe', () => {
    expect(RecipeInputSchema.safeParse({ targetTdsPercent: 1.3, targetYieldPercent: 20, method: 'percolation', dose: 15 }).success).toBe(true)
    expect(RecipeInputSchema.safeParse({ targetTdsPercent: 1.3, targetYieldPercent: 20, method: 'percolation' }).success).toBe(false)
  })

  it('take an uncertainty request with its optional parts', () => {
    expect(YieldUncertaintyInputSchema.safeParse({ method: 'immersion', tdsPercent: 1.2, dose: 10, waterMass: 180, scaleResolution: 0.1, repeatabilityTdsPercent: 0.02, readings: 3 }).success).toBe(true)
  })
})
