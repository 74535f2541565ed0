import fc from 'fast-check'
import { linearRegression, rSquared } from 'simple-statistics'
import { describe, expect, it } from 'vitest'
import { BrewingInputError, concentrationFromReading, diagnoseCalibration, fitCalibration, inverseUncertainty, lineUncertainty } from '../../shared/brewing'
import { agreeingDigits, readCsv, readHeader } from './fixtures'

describe('fitCalibration', () => {
  // NIST/ITL Statistical Reference Datasets, linear regression "Norris" (tests/fixtures/nist-norris.csv):
  // 36 points, certified values printed in the file's header and repeated here.
  const norris = readCsv('nist-norris.csv').map(row => ({ concentration: row.x!, reading: row.y! }))
  const certified = {
    intercept: -0.262323073774029,
    interceptSe: 0.232818234301152,
    slope: 1.00211681802045,
    slopeSe: 0.429796848199937e-3,
    residualSd: 0.884796396144373,
    rSquared: 0.999993745883712,
  }

  it('reads the certified values from the fixture header it was copied with', () => {
    const header = readHeader('nist-norris.csv')
    expect(header).toContain('1.00211681802045')
    expect(header).toContain('-0.262323073774029')
    expect(norris).toHaveLength(36)
  })

  it.each(Object.entries(certified))('reproduces the certified Norris %s to at least 9 significant digits', (key, value) => {
    const fit = fitCalibration(norris)
    expect(agreeingDigits(fit[key as keyof typeof certified], value)).toBeGreaterThanOrEqual(9)
  })

  it('counts the points and degrees of freedom', () => {
    const fit = fitCalibration(norris)
    expect(fit.n).toBe(36)
    expect(fit.degreesOfFreedom).toBe(34)
  })

  it('agrees with simple-statistics on random data sets', () => {
    const point = fc.record({
      concentration: fc.double({ min: 0, max: 30, noNaN: true }),
      reading: fc.double({ min: -10, max: 100, noNaN: true }),
    })
    fc.assert(fc.property(fc.array(point, { minLength: 3, maxLength: 20 }), (points) => {
      const xs = new Set(points.map(p => p.concentration))
      const ys = new Set(points.map(p => p.reading))
      fc.pre(xs.size >= 2 && ys.size >= 2)
      let fit
      try {
        fit = fitCalibration(points)
      }
      catch (error) {
        // A line with exactly zero slope is refused by design.
        return error instanceof BrewingInputError && error.field === 'points'
      }
      const pairs = points.map(p => [p.concentration, p.reading])
      const reference = linearRegression(pairs)
      const line = (x: number) => reference.m * x + reference.b
      expect(fit.slope).toBeCloseTo(reference.m, 6)
      expect(fit.intercept).toBeCloseTo(reference.b, 6)
      expect(fit.rSquared).toBeCloseTo(rSquared(pairs, line), 6)
      return true
    }), { numRuns: 300 })
  })
})

describe('concentrationFromReading and inverseUncertainty', () => {
  // Worked example of inverse prediction: Miller & Miller, Statistics and Chemometrics for Analytical
  // Chemistry, fluorescence calibration (x 0–12 pg/mL). b = 1.93, a = 1.52, s_y/x = 0.4329;
  // y0 = 2.9 → x0 = 0.72 ± 0.26, 13.5 → 6.21 ± 0.24, 23.0 → 11.13 ± 0.26 (single readings).
  // Values from memory of the book's example; they agree to the printed decimals below.
  const points = [[0, 2.1], [2, 5.0], [4, 9.0], [6, 12.6], [8, 17.3], [10, 21.0], [12, 24.7]]
    .map(([concentration, reading]) => ({ concentration: concentration!, reading: reading! }))
  const fit = fitCalibration(points)

  it('fits the textbook line', () => {
    expect(fit.slope).toBeCloseTo(1.93, 2)
    expect(fit.intercept).toBeCloseTo(1.52, 2)
    // The book prints 0.4329 from its rounded a and b; the unrounded fit gives 0.43285.
    expect(fit.residualSd).toBeCloseTo(0.4329, 3)
  })

  it.each([
    [2.9, 0.72, 0.26],
    [13.5, 6.21, 0.24],
    [23.0, 11.13, 0.26],
  ])('predicts reading %f as %f with standard uncertainty %f', (reading, concentration, uncertainty) => {
    expect(concentrationFromReading(fit, reading)).toBeCloseTo(concentration, 2)
    expect(inverseUncertainty(fit, reading)).toBeCloseTo(uncertainty, 2)
  })

  it('shrinks with replicate readings', () => {
    expect(inverseUncertainty(fit, 13.5, 4)).toBeLessThan(inverseUncertainty(fit, 13.5, 1))
  })

  it('refuses an uncertainty from two standards', () => {
    const two = fitCalibration([{ concentration: 0, reading: 0 }, { concentration: 10, reading: 8.5 }])
    expect(() => inverseUncertainty(two, 4)).toThrow(expect.objectContaining({ field: 'points' }))
    expect(() => lineUncertainty(two, 4)).toThrow(expect.objectContaining({ field: 'points' }))
  })

  it.each([[2.9, 1], [13.5, 1], [23.0, 4]])('splits the inverse uncertainty at y0 = %s, m = %s into the line and the new readings', (reading, replicates) => {
    // s_x0² = (s_y/x / b)² / m + line²: the same formula with the 1/m term taken out.
    const readingsPart = (fit.residualSd / fit.slope) ** 2 / replicates
    expect(inverseUncertainty(fit, reading, replicates) ** 2).toBeCloseTo(readingsPart + lineUncertainty(fit, reading) ** 2, 12)
  })

  it('has the smallest line uncertainty at the centre of the standards', () => {
    // (ȳ0 − ȳ)² vanishes at ȳ: what is left is s_y/x / |b| / √n.
    expect(lineUncertainty(fit, fit.meanReading)).toBeCloseTo(fit.residualSd / fit.slope / Math.sqrt(fit.n), 12)
    expect(lineUncertainty(fit, 2.9)).toBeGreaterThan(lineUncertainty(fit, fit.meanReading))
  })
})

describe('diagnoseCalibration', () => {
  // A clean four-standard sucrose calibration of a °Brix instrument (invented readings).
  const clean = [[0, 0.02], [5, 5.01], [10, 10.03], [15, 14.98]].map(([concentration, reading]) => ({ concentration: concentration!, reading: reading! }))

  it('passes a clean calibration without warnings', () => {
    const result = diagnoseCalibration(clean)
    expect(result.outlierIndex).toBeNull()
    expect(result.poorFit).toBe(false)
    expect(result.warnings).toEqual([])
    expect(result.residuals).toHaveLength(4)
  })

  it('points at a standard that was mixed wrong', () => {
    const spoiled = [...clean.slice(0, 2), { concentration: 10, reading: 11.2 }, clean[3]!, { concentration: 20, reading: 20.01 }]
    const result = diagnoseCalibration(spoiled)
    expect(result.outlierIndex).toBe(2)
    expect(result.warnings.join(' ')).toContain('Standard 3')
  })

  it('warns that three standards cannot reveal a wrong one', () => {
    expect(diagnoseCalibration(clean.slice(0, 3)).warnings.join(' ')).toContain('fourth')
  })

  it('flags a poor fit', () => {
    const poor = [[0, 0], [5, 7], [10, 8], [15, 16]].map(([concentration, reading]) => ({ concentration: concentration!, reading: reading! }))
    expect(diagnoseCalibration(poor).poorFit).toBe(true)
  })
})
