import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { brewUncertainty, computeBrew, fitCalibration, immersionSolids, lineUncertainty, yieldUncertainty } from '../../shared/brewing'

describe('computeBrew', () => {
  it('reproduces the worked pour-over from gross and tare weights and three %TDS readings', () => {
    // Handbook worked example: 15.0 g, 240.0 g, 1.35 %TDS → 21.60 % (mass balance, EY = TDS × B / D).
    const result = computeBrew({ method: 'percolation', strengthSource: 'direct', readings: [1.34, 1.35, 1.36], doseGross: 27.5, doseTare: 12.5, beverageGross: 652.6, beverageTare: 412.6 })
    expect(result.dose).toBeCloseTo(15, 10)
    expect(result.beverageMass).toBeCloseTo(240, 10)
    expect(result.tdsPercent).toBeCloseTo(1.35, 10)
    expect(result.yieldPercent).toBeCloseTo(21.6, 10)
    expect(result.missing).toEqual([])
  })

  it('reproduces the worked immersion from the water mass', () => {
    // Handbook worked example: 10 g in 180 g of water at 1.20 %TDS → 21.86 %.
    const result = computeBrew({ method: 'immersion', strengthSource: 'direct', readings: [1.2], dose: 10, waterMass: 180 })
    expect(result.yieldPercent).toBeCloseTo(21.862, 3)
  })

  it('takes a decanted immersion from the poured-off beverage and the LRR when no water was given', () => {
    // EY = TDS × (beverage + LRR × dose) / dose (mass balance; LRR 3 g/g for immersion is common
    // practice): 1.20 % × (150 g + 3 × 10 g) / 10 g = 21.6 %.
    const result = computeBrew({ method: 'immersion', strengthSource: 'direct', readings: [1.2], dose: 10, beverageMass: 150 })
    expect(result).toMatchObject({ yieldBasis: 'immersion-decanted', retainedRatio: 3 })
    expect(result.yieldPercent).toBeCloseTo(21.6, 10)
    expect(computeBrew({ method: 'immersion', strengthSource: 'direct', readings: [1.2], dose: 10, beverageMass: 150, retainedRatio: 2.5 }).yieldPercent).toBeCloseTo(21.0, 10)
  })

  it('gives the same yield from the water and from the poured-off beverage of one immersion brew', () => {
    // Mass balance: the liquid is the water plus the dissolved solids S = W × TDS / (1 − TDS); the
    // grounds keep LRR × dose of it, the rest is poured off. Both routes must then agree.
    fc.assert(fc.property(
      fc.double({ min: 0.5, max: 2.5, noNaN: true }),
      fc.double({ min: 8, max: 30, noNaN: true }),
      fc.double({ min: 12, max: 18, noNaN: true }),
      fc.double({ min: 1.5, max: 3.5, noNaN: true }),
      (tds, dose, ratio, lrr) => {
        const water = dose * ratio
        const beverage = water + immersionSolids({ tdsPercent: tds, waterMass: water }) - lrr * dose
        const fromWater = computeBrew({ method: 'immersion', strengthSource: 'direct', readings: [tds], dose, waterMass: water })
        const fromBeverage = computeBrew({ method: 'immersion', strengthSource: 'direct', readings: [tds], dose, beverageMass: beverage, retainedRatio: lrr })
        expect(fromBeverage.yieldPercent).toBeCloseTo(fromWater.yieldPercent!, 9)
      },
    ))
  })

  it('prefers the water of an immersion brew when both water and beverage were weighed', () => {
    const result = computeBrew({ method: 'immersion', strengthSource: 'direct', readings: [1.2], dose: 10, waterMass: 180, beverageMass: 150 })
    expect(result).toMatchObject({ yieldBasis: 'immersion-water', retainedRatio: null, beverageMass: 150 })
    expect(result.yieldPercent).toBeCloseTo(21.862, 3)
  })

  it('estimates the beverage from the water and the LRR when it was not weighed', () => {
    // 250 g of water on 15 g, LRR 2.0 (paper filter, common practice): 220 g of beverage.
    const result = computeBrew({ method: 'percolation', strengthSource: 'direct', readings: [1.4], dose: 15, waterMass: 250 })
    expect(result).toMatchObject({ beverageMass: 220, beverageEstimated: true, yieldBasis: 'water-estimate', retainedRatio: 2 })
    expect(result.yieldPercent).toBeCloseTo(1.4 * 220 / 15, 10)
  })

  it('goes through a sucrose calibration and the °Brix factor', () => {
    // Sucrose standards read at the ICUMSA table's nD for 0–3 °Brix. The fitted line puts a coffee
    // reading of nD 1.33528 at 1.592 °Brix, and 0.85 × 1.592 = 1.353 %TDS (factor: common practice).
    const fit = fitCalibration([[0, 1.33299], [1, 1.33442], [2, 1.33586], [3, 1.33732]].map(([concentration, reading]) => ({ concentration: concentration!, reading: reading! })))
    const result = computeBrew({ method: 'espresso', strengthSource: 'calibration', calibration: { fit, standardUnit: 'brix' }, readings: [1.33528], dose: 18, beverageMass: 36 })
    expect(result.tdsPercent).toBeCloseTo(1.353, 3)
  })

  it('says what is still missing instead of returning NaN', () => {
    expect(computeBrew({ method: 'percolation', strengthSource: 'calibration', readings: [1.34] })).toMatchObject({ tdsPercent: null, yieldPercent: null, missing: ['calibration', 'dose', 'beverageMass'] })
    expect(computeBrew({ method: 'immersion', strengthSource: 'direct', readings: [] }).missing).toEqual(['readings', 'dose', 'waterMass'])
  })

  it('reports a refused input with its field', () => {
    expect(computeBrew({ method: 'percolation', strengthSource: 'direct', readings: [1.3], doseGross: 10, doseTare: 12.5, beverageMass: 240 }).problem).toMatchObject({ field: 'gross' })
  })
})

describe('brewUncertainty', () => {
  const scale = { scaleResolution: 0.1, byDifference: true }
  const pourOver = { method: 'percolation', strengthSource: 'direct', readings: [1.34, 1.35, 1.36], dose: 15, beverageMass: 240 } as const

  it('is nothing until the brew has a result', () => {
    const input = { ...pourOver, readings: [] }
    expect(brewUncertainty(input, computeBrew(input), { ...scale, repeatability: 0.02 })).toBeNull()
  })

  it('is the expanded GUM propagation for %TDS readings', () => {
    const u = brewUncertainty(pourOver, computeBrew(pourOver), { ...scale, repeatability: 0.02 })!
    const reference = yieldUncertainty({ method: 'percolation', tdsPercent: 1.35, dose: 15, beverageMass: 240, scaleResolution: 0.1, byDifference: true, repeatabilityTdsPercent: 0.02, readings: 3 })
    expect(u.tdsPercent).toBeCloseTo(reference.expanded.tdsPercent, 12)
    expect(u.yieldPercent).toBeCloseTo(reference.expanded.yieldPercent, 12)
    expect(u.omissions).toEqual([])
  })

  it('carries a °Brix repeatability through the factor', () => {
    // TDS = factor × °Brix, so u(TDS) = factor × u(°Brix) / √n (first order).
    const input = { ...pourOver, strengthSource: 'brix-factor', brixFactor: 0.85, readings: [1.6, 1.6] } as const
    const u = brewUncertainty(input, computeBrew(input), { ...scale, repeatability: 0.1 })!
    expect(u.tdsPercent).toBeCloseTo(2 * 0.85 * 0.1 / Math.sqrt(2), 12)
    expect(u.omissions).toContain('the uncertainty of the °Brix factor')
  })

  it('carries an nD repeatability through the slope of a calibration that fits exactly', () => {
    // Standards on an exact line (no residual): only the new readings count, u = factor × s / b / √n.
    const points = [0, 5, 10, 15].map(brix => ({ concentration: brix, reading: 1.33299 + 0.0015 * brix }))
    const input = { ...pourOver, strengthSource: 'calibration', calibration: { fit: fitCalibration(points), standardUnit: 'brix' }, brixFactor: 0.85, readings: [1.3569, 1.357, 1.3571] } as const
    const u = brewUncertainty(input, computeBrew(input), { ...scale, repeatability: 0.00002 })!
    expect(u.tdsPercent).toBeCloseTo(2 * 0.85 * (0.00002 / 0.0015) / Math.sqrt(3), 10)
  })

  it('adds the line\'s own uncertainty in quadrature when the standards scatter', () => {
    // ICUMSA table nD for 0, 5, 10 and 15 °Brix (tests/fixtures/icumsa-sucrose-nd20.csv): slightly curved.
    const points = [[0, 1.33299], [5, 1.34026], [10, 1.34782], [15, 1.35568]].map(([c, r]) => ({ concentration: c!, reading: r! }))
    const fit = fitCalibration(points)
    const input = { ...pourOver, strengthSource: 'calibration', calibration: { fit, standardUnit: 'brix' }, readings: [1.3357] } as const
    const withLine = brewUncertainty(input, computeBrew(input), { ...scale, repeatability: 0.00002 })!
    const readingsOnly = 0.85 * 0.00002 / fit.slope
    const line = 0.85 * lineUncertainty(fit, 1.3357)
    expect(line).toBeGreaterThan(readingsOnly)
    expect(withLine.tdsPercent / 2).toBeCloseTo(Math.hypot(readingsOnly, line), 12)
    const two = { ...input, calibration: { fit: fitCalibration(points.slice(0, 2)), standardUnit: 'brix' } } as const
    expect(brewUncertainty(two, computeBrew(two), { ...scale, repeatability: 0.00002 })!.omissions[0]).toContain('only two standards')
  })

  it('says it leaves out the LRR when the beverage was estimated', () => {
    const input = { method: 'percolation', strengthSource: 'direct', readings: [1.4], dose: 15, waterMass: 250 } as const
    expect(brewUncertainty(input, computeBrew(input), { ...scale, repeatability: 0.02 })!.omissions).toEqual(['the uncertainty of the LRR'])
  })
})
