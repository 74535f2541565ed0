import { describe, expect, it } from 'vitest'
import { computeBrew, fitCalibration } from '../../shared/brewing'

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

  it('estimates the beverage from the water and the LRR when it was not weighed', () => {
    // 250 g of water on 15 g, LRR 2.0 (paper filter, common practice): 220 g of beverage.
    const result = computeBrew({ method: 'percolation', strengthSource: 'direct', readings: [1.4], dose: 15, waterMass: 250 })
    expect(result).toMatchObject({ beverageMass: 220, beverageEstimated: true })
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
