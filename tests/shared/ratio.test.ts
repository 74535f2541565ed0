import type { BrewInput } from '../../shared/brewing'
import { describe, expect, it } from 'vitest'
import { brewRatio, brewRatioOf, computeBrew, cuppingDose, cuppingRatio, formatRatio, gramsPerLitre, ratioText } from '../../shared/brewing'

describe('brewRatio', () => {
  it('writes 36 g of espresso from 18 g as 1:2.0, grams of beverage per gram of coffee', () => {
    expect(ratioText(brewRatio(18, 36))).toBe('1:2.0 (grams of beverage per gram of coffee)')
  })

  it('rounds half up: 240.75 g from 15 g is 16.05, shown 1:16.1', () => {
    expect(formatRatio(brewRatio(15, 240.75))).toBe('1:16.1')
  })
})

describe('brewRatioOf', () => {
  const direct = { method: 'percolation' as const, strengthSource: 'direct' as const, readings: [1.35] }

  it.each<[string, BrewInput]>([
    ['a weighed percolation', { ...direct, dose: 15, beverageMass: 240 }],
    ['a percolation reckoned from its water', { ...direct, dose: 15, waterMass: 270 }],
    ['an espresso', { ...direct, method: 'espresso' as const, readings: [9.5], dose: 18, beverageMass: 38.5 }],
    ['a full immersion by its water', { ...direct, method: 'immersion' as const, readings: [1.2], dose: 10, waterMass: 180 }],
    ['a decanted immersion', { ...direct, method: 'immersion' as const, readings: [1.3], dose: 12, beverageMass: 170, retainedRatio: 3 }],
  ])('puts %s on the chart line of its ratio: EY / TDS', (_what, input) => {
    const result = computeBrew(input)
    const ratio = brewRatioOf(result, input.waterMass ?? null)!
    expect(ratio.ratio).toBeCloseTo(result.yieldPercent! / result.tdsPercent!, 10)
  })

  it('says a beverage reckoned from the water is an estimate', () => {
    const result = computeBrew({ ...direct, dose: 15, waterMass: 270 })
    // (270 − 2.0 × 15) / 15 = 16.0 with the common-practice LRR of 2.0 g/g.
    expect(brewRatioOf(result, 270)).toEqual({ ratio: 16, estimated: true })
  })

  it('gives a full immersion without readings its water per gram, as an estimate', () => {
    const result = computeBrew({ method: 'immersion', strengthSource: 'direct', readings: [], dose: 10, waterMass: 180 })
    expect(brewRatioOf(result, 180)).toEqual({ ratio: 18, estimated: true })
  })

  it('gives none before the dose is known', () => {
    expect(brewRatioOf(computeBrew({ ...direct, beverageMass: 240 }), null)).toBeNull()
  })
})

describe('gramsPerLitre', () => {
  it('puts 15 g in 250 g of water at 60 g/L', () => {
    expect(gramsPerLitre(15, 250)).toBeCloseTo(60, 10)
  })
})

describe('cuppingDose', () => {
  // SCA cupping protocol: 8.25 g ± 0.25 g of coffee per 150 mL of water (0.055 g/mL).
  it('gives 8.25 g for a 150 mL bowl, with 8.00 to 8.50 g allowed', () => {
    const bowl = cuppingDose(150)
    expect(bowl.dose).toBeCloseTo(8.25, 10)
    expect(bowl.min).toBeCloseTo(8.0, 10)
    expect(bowl.max).toBeCloseTo(8.5, 10)
  })

  it('scales to the bowl: 0.055 g per mL', () => {
    expect(cuppingRatio.gramsPerMl).toBeCloseTo(0.055, 12)
    expect(cuppingDose(200).dose).toBeCloseTo(11, 10)
  })
})
