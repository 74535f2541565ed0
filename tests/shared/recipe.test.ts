import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import * as brewing from '../../shared/brewing'
import { BrewingInputError, immersionYield, percolationYield, solveRecipe, yieldUncertainty } from '../../shared/brewing'

describe('solveRecipe', () => {
  it('solves a pour-over: 15 g at 1.35 %TDS and 21.6 % EY needs 240 g of beverage', () => {
    // The inverse of the handbook's worked pour-over example; LRR 2.0 (common practice) adds 30 g.
    const recipe = solveRecipe({ targetTdsPercent: 1.35, targetYieldPercent: 21.6, dose: 15, method: 'percolation' })
    expect(recipe.beverageMass).toBeCloseTo(240, 10)
    expect(recipe.waterMass).toBeCloseTo(270, 10)
    // Brew ratio in grams of beverage per gram of coffee: 240 / 15 = 16.
    expect(recipe.brewRatio).toBeCloseTo(16, 10)
  })

  it('solves an espresso from the beverage wanted: 36 g at 10 %TDS and 20 % needs 18 g', () => {
    const recipe = solveRecipe({ targetTdsPercent: 10, targetYieldPercent: 20, beverageMass: 36, method: 'espresso' })
    expect(recipe.dose).toBeCloseTo(18, 10)
  })

  it('solves an immersion: 10 g at 1.20 %TDS and 21.86 % needs about 180 g of water', () => {
    // The inverse of the handbook's worked immersion example.
    const recipe = solveRecipe({ targetTdsPercent: 1.2, targetYieldPercent: 21.862348, dose: 10, method: 'immersion' })
    expect(recipe.waterMass).toBeCloseTo(180, 3)
    expect(recipe.beverageMass).toBeCloseTo(150, 3)
  })
})

// Property-based checks (fast-check) over the ranges practitioners brew in.
const tds = fc.double({ min: 0.5, max: 14, noNaN: true })
const ey = fc.double({ min: 12, max: 28, noNaN: true })
const dose = fc.double({ min: 5, max: 120, noNaN: true })
const lrr = fc.double({ min: 0, max: 3, noNaN: true })

describe('properties', () => {
  it('solving a percolation recipe and computing its yield returns the targets', () => {
    fc.assert(fc.property(tds, ey, dose, lrr, (t, e, d, r) => {
      const recipe = solveRecipe({ targetTdsPercent: t, targetYieldPercent: e, dose: d, method: 'percolation', retainedRatio: r })
      expect(percolationYield({ tdsPercent: t, beverageMass: recipe.beverageMass, dose: recipe.dose })).toBeCloseTo(e, 9)
    }))
  })

  it('solving an immersion recipe and computing its yield returns the targets', () => {
    fc.assert(fc.property(fc.double({ min: 0.5, max: 3, noNaN: true }), ey, dose, (t, e, d) => {
      const recipe = solveRecipe({ targetTdsPercent: t, targetYieldPercent: e, dose: d, method: 'immersion', retainedRatio: 2 })
      expect(immersionYield({ tdsPercent: t, waterMass: recipe.waterMass, dose: recipe.dose })).toBeCloseTo(e, 9)
    }))
  })

  it('percolation and immersion agree in the limit of tiny strength', () => {
    // With beverage = water, EY_immersion / EY_percolation = 1 / (1 − TDS) → 1 as TDS → 0.
    fc.assert(fc.property(fc.double({ min: 1e-6, max: 0.01, noNaN: true }), dose, fc.double({ min: 50, max: 2000, noNaN: true }), (t, d, w) => {
      const perc = percolationYield({ tdsPercent: t, beverageMass: w, dose: d })
      const imm = immersionYield({ tdsPercent: t, waterMass: w, dose: d })
      expect(Math.abs(imm - perc) / perc).toBeLessThanOrEqual(t / 100 / (1 - t / 100) + 1e-12)
    }))
  })

  it('uncertainty grows with the scale resolution', () => {
    fc.assert(fc.property(tds, dose, fc.double({ min: 0.001, max: 1, noNaN: true }), fc.double({ min: 1.01, max: 10, noNaN: true }), (t, d, resolution, factor) => {
      const base = { method: 'percolation' as const, tdsPercent: t, dose: d, beverageMass: d * 16, repeatabilityTdsPercent: 0.02 }
      const fine = yieldUncertainty({ ...base, scaleResolution: resolution })
      const coarse = yieldUncertainty({ ...base, scaleResolution: resolution * factor })
      expect(coarse.yieldPercent).toBeGreaterThan(fine.yieldPercent)
    }))
  })

  it('no function returns NaN or Infinity for any valid input', () => {
    const finite = (value: unknown): void => {
      if (typeof value === 'number')
        expect(Number.isFinite(value)).toBe(true)
      else if (value && typeof value === 'object')
        Object.values(value).forEach(finite)
    }
    fc.assert(fc.property(tds, ey, dose, lrr, fc.double({ min: 0.001, max: 1, noNaN: true }), fc.double({ min: 0, max: 99.9, noNaN: true }), (t, e, d, r, resolution, moisture) => {
      const water = d * 17
      const percolation = solveRecipe({ targetTdsPercent: t, targetYieldPercent: e, dose: d, method: 'percolation', retainedRatio: r })
      finite(percolation)
      finite(brewing.percolationYield({ tdsPercent: t, beverageMass: water, dose: d }))
      finite(brewing.immersionYield({ tdsPercent: t, waterMass: water, dose: d }))
      finite(brewing.decantedYield({ tdsPercent: t, beverageMass: water, dose: d, retainedRatio: r }))
      finite(brewing.dryDose(d, moisture))
      finite(brewing.brewRatio(d, water))
      finite(brewing.gramsPerLitre(d, water))
      finite(brewing.yieldUncertainty({ method: 'immersion', tdsPercent: t, dose: d, waterMass: water, scaleResolution: resolution, repeatabilityTdsPercent: 0.02 }))
      finite(brewing.zoneVerdict(brewing.zonePresets[0]!, { tdsPercent: t, yieldPercent: e }))
      finite(brewing.summarizeReadings([t, t * 1.01, t * 0.99]))
      finite(brewing.roundHalfUp(t * e, 2))
      try {
        finite(solveRecipe({ targetTdsPercent: t, targetYieldPercent: e, dose: d, method: 'immersion', retainedRatio: r }))
      }
      catch (error) {
        // A strength the grounds' retained water makes impossible is refused, never answered with NaN.
        expect(error).toBeInstanceOf(BrewingInputError)
      }
    }), { numRuns: 300 })
  })
})
