import { mean, sampleStandardDeviation } from 'simple-statistics'
import { describe, expect, it } from 'vitest'
import { BrewingInputError, cuppingDose, cuppingZone, doseToleranceSpread, immersionYield, summarizeBowls, zoneVerdict } from '../../shared/brewing'

const bowls = (...tds: number[]) => tds.map(tdsPercent => ({ tdsPercent, yieldPercent: immersionYield({ tdsPercent, waterMass: 150, dose: 8.25 }) }))

describe('summarizeBowls', () => {
  it('agrees with simple-statistics on the mean and the bowl-to-bowl spread', () => {
    const tds = [1.12, 1.13, 1.11, 1.12, 1.14]
    const summary = summarizeBowls(bowls(...tds))
    expect(summary.meanTdsPercent).toBeCloseTo(mean(tds), 12)
    expect(summary.sdTdsPercent).toBeCloseTo(sampleStandardDeviation(tds), 12)
    expect(summary.rangeTdsPercent).toBeCloseTo(0.03, 12)
    expect(summary.meanYieldPercent).toBeCloseTo(mean(bowls(...tds).map(b => b.yieldPercent)), 12)
    expect(summary).toMatchObject({ n: 5, outlier: null, uniform: true })
  })

  it('flags the bowl that sits far from the others, and keeps it in the mean', () => {
    // Q = (1.24 − 1.13) / (1.24 − 1.11) = 0.846 > 0.710 (Rorabacher 1991, five values, 95 %), and
    // the 0.11 %TDS gap is wider than the 6 % of the mean the dose tolerance explains (about 0.07).
    const summary = summarizeBowls(bowls(1.12, 1.13, 1.24, 1.11, 1.12))
    expect(summary.outlier).toMatchObject({ index: 2, tdsPercent: 1.24 })
    expect(summary.outlier!.gapTdsPercent).toBeCloseTo(0.11, 12)
    expect(summary.outlier!.meanOthersTdsPercent).toBeCloseTo(1.12, 12)
    expect(summary.meanTdsPercent).toBeCloseTo(mean([1.12, 1.13, 1.24, 1.11, 1.12]), 12)
    expect(summary.uniform).toBe(false)
  })

  it('leaves alone a bowl Dixon\'s Q picks out when the dose tolerance explains its gap', () => {
    // 1.10, 1.10, 1.10, 1.15: Q = 1 (the others agree exactly), but 0.05 %TDS is within 6 % of the mean.
    const summary = summarizeBowls(bowls(1.10, 1.10, 1.10, 1.15))
    expect(summary.outlier).toBeNull()
    expect(summary.uniform).toBe(true)
  })

  it('says nothing of uniformity with fewer than three bowls', () => {
    expect(summarizeBowls(bowls(1.1, 1.4)).uniform).toBeNull()
  })

  it('takes the dose tolerance from the SCA cupping protocol: ± 0.25 g on 8.25 g', () => {
    expect(doseToleranceSpread).toBeCloseTo(0.5 / 8.25, 12)
  })

  it('keeps the mean extraction to the bowls whose yield is known', () => {
    expect(summarizeBowls([{ tdsPercent: 1.1, yieldPercent: 20 }, { tdsPercent: 1.2, yieldPercent: null }]).meanYieldPercent).toBe(20)
  })

  it.each([
    [[], 'bowls'],
    [[{ tdsPercent: 0, yieldPercent: null }], 'bowls.0.tdsPercent'],
    [[{ tdsPercent: 1.1, yieldPercent: 20 }, { tdsPercent: Number.NaN, yieldPercent: 20 }], 'bowls.1.tdsPercent'],
  ])('refuses %o, naming %s', (given, field) => {
    expect(() => summarizeBowls(given)).toThrow(BrewingInputError)
    try {
      summarizeBowls(given)
    }
    catch (error) {
      expect((error as BrewingInputError).field).toBe(field)
    }
  })
})

describe('cuppingZone', () => {
  it.each([
    // The SCA cupping ratio and its tolerance (8.25 g ± 0.25 g per 150 mL) at 18 % and 22 % extraction.
    [8.0, 18],
    [8.25, 18],
    [8.5, 18],
    [8.0, 22],
    [8.25, 22],
    [8.5, 22],
    [8.25, 20],
  ])('holds a bowl of %f g in 150 g of water extracted to %f per cent', (dose, ey) => {
    // Full immersion: EY = W × TDS / ((1 − TDS) × dose), so TDS = EY × dose / (W + EY × dose), as fractions.
    const solids = dose * ey / 100
    const tdsPercent = 100 * solids / (150 + solids)
    expect(zoneVerdict(cuppingZone, { tdsPercent, yieldPercent: ey }).inZone).toBe(true)
  })

  it('matches the protocol dose for a 150 mL bowl', () => {
    expect(cuppingDose(150).dose).toBeCloseTo(8.25, 12)
  })

  it.each([
    [{ tdsPercent: 1.1, yieldPercent: 20 }, 'Inside the cupping zone'],
    [{ tdsPercent: 0.9, yieldPercent: 16.5 }, 'Below the cupping zone in strength and extraction'],
    [{ tdsPercent: 1.4, yieldPercent: 20 }, 'Above the cupping zone in strength'],
    [{ tdsPercent: 1.1, yieldPercent: 23.5 }, 'Above the cupping zone in extraction'],
  ])('says where a bowl at %o sits (%s), with no brewing advice', (measured, headline) => {
    const verdict = zoneVerdict(cuppingZone, measured)
    expect(verdict.headline).toBe(headline)
    expect(verdict.adjustments.join(' ')).not.toMatch(/grind|finer|coarser|contact time|hotter|cooler|less water|more water/i)
    expect(verdict.adjustments).toEqual([expect.stringMatching(/compared, not corrected/)])
  })
})
