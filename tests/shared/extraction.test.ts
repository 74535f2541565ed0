import { describe, expect, it } from 'vitest'
import { beverageFromWater, decantedYield, defaultRetainedRatio, dryDose, immersionSolids, immersionYield, massByDifference, percolationYield } from '../../shared/brewing'

describe('percolationYield', () => {
  // Worked examples from the handbook's reference sheet, computed from EY = TDS × beverage / dose
  // (mass balance; Batali, Ristenpart & Guinard, Sci. Rep. 10 (2020), doi:10.1038/s41598-020-73341-4).
  it('gives 20.00 % for an 18.0 g espresso to 36.0 g at 10.00 %TDS', () => {
    expect(percolationYield({ tdsPercent: 10, beverageMass: 36, dose: 18 })).toBeCloseTo(20, 10)
  })

  it('gives 21.60 % for a 15.0 g pour-over to 240.0 g at 1.35 %TDS', () => {
    expect(percolationYield({ tdsPercent: 1.35, beverageMass: 240, dose: 15 })).toBeCloseTo(21.6, 10)
  })

  it('gives 19.50 % for a 60 g batch brew to 975 g at 1.20 %TDS (computed by hand)', () => {
    expect(percolationYield({ tdsPercent: 1.2, beverageMass: 975, dose: 60 })).toBeCloseTo(19.5, 10)
  })
})

describe('immersionYield', () => {
  // Worked example: W × TDS / ((1 − TDS) × dose), a single well-mixed liquid (Liang, Chan &
  // Ristenpart, Sci. Rep. 11 (2021), doi:10.1038/s41598-021-85787-1).
  it('gives 21.86 % for 10 g in 180 g of water at 1.20 %TDS, where the naive W × TDS / dose gives 21.60 %', () => {
    expect(immersionYield({ tdsPercent: 1.2, waterMass: 180, dose: 10 })).toBeCloseTo(21.862, 3)
    expect((180 * 1.2) / 10).toBeCloseTo(21.6, 10)
  })

  it('finds the dissolved solids as W × TDS / (1 − TDS)', () => {
    // 180 × 0.012 / 0.988 = 2.18623 g (computed by hand).
    expect(immersionSolids({ tdsPercent: 1.2, waterMass: 180 })).toBeCloseTo(2.18623, 5)
  })

  it('puts a cupping bowl at 1.14 %TDS near the 21 % immersion equilibrium (Liang, Chan & Ristenpart 2021)', () => {
    // 8.25 g in 150 g of water (SCA cupping ratio) at 1.14 %TDS: 150 × 0.0114 / (0.9886 × 8.25) = 20.97 %.
    expect(immersionYield({ tdsPercent: 1.14, waterMass: 150, dose: 8.25 })).toBeCloseTo(20.97, 2)
  })
})

describe('decantedYield', () => {
  it('counts the liquid left in the grounds: TDS × (beverage + LRR × dose) / dose', () => {
    // 1.30 %TDS, 200 g poured off, 15 g dose, LRR 3 g/g: 1.30 × 245 / 15 = 21.233 % (computed by hand).
    expect(decantedYield({ tdsPercent: 1.3, beverageMass: 200, dose: 15, retainedRatio: 3 })).toBeCloseTo(21.2333, 4)
  })
})

describe('beverageFromWater', () => {
  it('takes the retained liquid off the water: W − LRR × dose', () => {
    // 250 g of water on 15 g with LRR 2.0 (paper filter, common practice) leaves 220 g.
    expect(beverageFromWater({ waterMass: 250, dose: 15, retainedRatio: defaultRetainedRatio.percolation })).toBe(220)
  })

  it('uses the common-practice LRR defaults: 2.0 for percolation, 3 for immersion', () => {
    expect(defaultRetainedRatio).toEqual({ percolation: 2, immersion: 3 })
  })
})

describe('massByDifference', () => {
  it('subtracts the tare from the gross weight', () => {
    // A 412.6 g carafe holding brew weighs 652.9 g: 240.3 g of beverage.
    expect(massByDifference(652.9, 412.6)).toBeCloseTo(240.3, 10)
  })

  it('allows an empty vessel (zero net)', () => {
    expect(massByDifference(412.6, 412.6)).toBe(0)
  })
})

describe('dryDose', () => {
  it('removes the moisture of the grounds', () => {
    // Roasted coffee holds a few percent water; 18 g at 2.5 % is 17.55 g dry (computed by hand).
    expect(dryDose(18, 2.5)).toBeCloseTo(17.55, 10)
    expect(dryDose(18, 0)).toBe(18)
  })
})
