import { mean, sampleStandardDeviation } from 'simple-statistics'
import { describe, expect, it } from 'vitest'
import { summarizeReadings } from '../../shared/brewing'

describe('summarizeReadings', () => {
  it('agrees with simple-statistics on mean and sample standard deviation', () => {
    const values = [1.38, 1.36, 1.39, 1.37]
    const summary = summarizeReadings(values)
    expect(summary.mean).toBeCloseTo(mean(values), 12)
    expect(summary.sd).toBeCloseTo(sampleStandardDeviation(values), 12)
    expect(summary.standardError).toBeCloseTo(sampleStandardDeviation(values) / 2, 12)
    expect(summary).toMatchObject({ n: 4, min: 1.36, max: 1.39 })
    expect(summary.range).toBeCloseTo(0.03, 12)
  })

  it('keeps a single reading, with no spread', () => {
    expect(summarizeReadings([1.42])).toMatchObject({ n: 1, mean: 1.42, sd: 0, outlier: null })
  })

  it('does not reject a reading that Dixon\'s Q keeps', () => {
    // Miller & Miller's nitrite example (values from memory): 0.403, 0.410, 0.401, 0.380 gives
    // Q = 0.021 / 0.030 = 0.70, below the 95 % critical value for four readings, so 0.380 stays.
    const summary = summarizeReadings([0.403, 0.410, 0.401, 0.380])
    expect(summary.outlier).toBeNull()
  })

  it('flags a reading that Dixon\'s Q rejects', () => {
    // Q = (1.52 − 1.39) / (1.52 − 1.37) = 0.867 > 0.829 (Rorabacher 1991, four readings, 95 %).
    const summary = summarizeReadings([1.38, 1.52, 1.37, 1.39])
    expect(summary.outlier).toMatchObject({ index: 1, value: 1.52, critical: 0.829 })
    expect(summary.outlier!.q).toBeCloseTo(0.8667, 4)
  })

  it('checks the low end too', () => {
    const summary = summarizeReadings([1.41, 1.40, 1.42, 1.41, 1.25])
    expect(summary.outlier).toMatchObject({ index: 4, value: 1.25 })
  })

  it('leaves identical readings alone', () => {
    expect(summarizeReadings([1.3, 1.3, 1.3]).outlier).toBeNull()
  })
})
