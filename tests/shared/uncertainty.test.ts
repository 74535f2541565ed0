import type { YieldUncertaintyInput } from '../../shared/brewing'
import { describe, expect, it } from 'vitest'
import { decantedYield, immersionYield, percolationYield, scaleReadingUncertainty, yieldUncertainty } from '../../shared/brewing'

/** A small seeded generator (mulberry32) so the Monte Carlo check is repeatable. */
function random(seed: number): () => number {
  let state = seed >>> 0
  return () => {
    state = (state + 0x6D2B79F5) >>> 0
    let t = state
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

const pourOver: YieldUncertaintyInput = {
  method: 'percolation',
  tdsPercent: 1.35,
  dose: 15,
  beverageMass: 240,
  scaleResolution: 0.1,
  repeatabilityTdsPercent: 0.02,
  readings: 3,
}

describe('scaleReadingUncertainty', () => {
  it('is resolution / √12, a rectangular distribution of half-width resolution / 2 (GUM 4.3.7, F.2.2.1)', () => {
    expect(scaleReadingUncertainty(0.1)).toBeCloseTo(0.028868, 6)
    expect(scaleReadingUncertainty(1)).toBeCloseTo(0.288675, 6)
  })
})

describe('yieldUncertainty', () => {
  it('combines repeatability over the readings: 0.02 / √3 %TDS', () => {
    expect(yieldUncertainty(pourOver).tdsPercent).toBeCloseTo(0.02 / Math.sqrt(3), 12)
  })

  it('adds a calibration uncertainty in quadrature', () => {
    const u = yieldUncertainty({ ...pourOver, calibrationTdsPercent: 0.01 })
    expect(u.tdsPercent).toBeCloseTo(Math.hypot(0.02 / Math.sqrt(3), 0.01), 12)
  })

  it.each([
    ['percolation', pourOver, (x: number[]) => percolationYield({ tdsPercent: x[0]!, dose: x[1]!, beverageMass: x[2]! }), [1.35, 15, 240]],
    ['immersion', { ...pourOver, method: 'immersion', beverageMass: undefined, waterMass: 180, dose: 10, tdsPercent: 1.2 } as YieldUncertaintyInput, (x: number[]) => immersionYield({ tdsPercent: x[0]!, dose: x[1]!, waterMass: x[2]! }), [1.2, 10, 180]],
    ['decanted immersion', { ...pourOver, method: 'immersion', beverageMass: 150, retainedRatio: 3, dose: 10, tdsPercent: 1.2 } as YieldUncertaintyInput, (x: number[]) => decantedYield({ tdsPercent: x[0]!, dose: x[1]!, beverageMass: x[2]!, retainedRatio: 3 }), [1.2, 10, 150]],
  ] as const)('matches the law of propagation with numerical derivatives (%s)', (_name, input, model, at) => {
    // Independent check of the analytic partial derivatives by central differences.
    const u = yieldUncertainty(input)
    const inputs = [u.tdsPercent, u.massGrams, u.massGrams]
    const terms = at.map((_, i) => {
      const h = at[i]! * 1e-6
      const up: number[] = [...at]
      const down: number[] = [...at]
      up[i] = at[i]! + h
      down[i] = at[i]! - h
      return ((model(up) - model(down)) / (2 * h)) * inputs[i]!
    })
    expect(u.yieldPercent).toBeCloseTo(Math.hypot(...terms), 10)
  })

  it('agrees with a Monte Carlo propagation of the same distributions (GUM Supplement 1, JCGM 101:2008)', () => {
    const next = random(20261201)
    const gaussian = (): number => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next())
    // Each mass by difference: two readings, each off by a rectangular error of ± resolution / 2.
    const weighing = (): number => (next() - 0.5) * 0.1 - (next() - 0.5) * 0.1
    const u = yieldUncertainty(pourOver)
    const samples = 200_000
    let sum = 0
    let sumSquares = 0
    for (let i = 0; i < samples; i++) {
      const tds = 1.35 + gaussian() * u.tdsPercent
      const ey = percolationYield({ tdsPercent: tds, dose: 15 + weighing(), beverageMass: 240 + weighing() })
      sum += ey
      sumSquares += ey * ey
    }
    const mcSd = Math.sqrt(sumSquares / samples - (sum / samples) ** 2)
    expect(Math.abs(mcSd - u.yieldPercent) / u.yieldPercent).toBeLessThan(0.02)
  })

  it('grows with the scale resolution', () => {
    const fine = yieldUncertainty({ ...pourOver, scaleResolution: 0.01 })
    const coarse = yieldUncertainty({ ...pourOver, scaleResolution: 1 })
    expect(coarse.yieldPercent).toBeGreaterThan(fine.yieldPercent)
    expect(coarse.contributions.dose).toBeGreaterThan(fine.contributions.dose)
  })

  it('reports k = 2 expanded values for the ± beside a result', () => {
    const u = yieldUncertainty(pourOver)
    expect(u.expanded.yieldPercent).toBeCloseTo(2 * u.yieldPercent, 12)
    expect(u.expanded.tdsPercent).toBeCloseTo(2 * u.tdsPercent, 12)
  })

  it('is dominated by the refractometer, not the scale, for a pour-over', () => {
    // 0.0115 %TDS × 16 g of beverage per gram = 0.185 points; 0.041 g × 21.6 % / 15 g = 0.059 points.
    const { contributions } = yieldUncertainty(pourOver)
    expect(contributions.strength).toBeCloseTo(0.1848, 4)
    expect(contributions.dose).toBeCloseTo(0.0588, 4)
    expect(contributions.strength).toBeGreaterThan(3 * contributions.dose)
  })
})
