import { BrewingInputError, requireFinite } from './errors'

/** One calibration standard: its known concentration and what the instrument read for it. */
export interface CalibrationPoint {
  /** Known concentration of the standard (°Brix or %TDS by mass). */
  concentration: number
  /** The instrument's reading for it (nD, °Brix or %TDS, as the instrument reports). */
  reading: number
}

/** The least-squares line `reading = intercept + slope × concentration` and its statistics. */
export interface CalibrationFit {
  slope: number
  intercept: number
  n: number
  rSquared: number
  /** Residual standard deviation s_y/x = √(SSE / (n − 2)); 0 when n = 2 (no degrees of freedom). */
  residualSd: number
  slopeSe: number
  interceptSe: number
  meanConcentration: number
  meanReading: number
  /** Σ (x − x̄)² of the concentrations. */
  sxx: number
  degreesOfFreedom: number
}

/**
 * Ordinary least squares with centred sums (two passes), which keeps full precision on data such as
 * NIST's Norris set where raw sums of squares would lose digits.
 * @param points - at least two standards with two different concentrations
 */
export function fitCalibration(points: readonly CalibrationPoint[]): CalibrationFit {
  if (!Array.isArray(points) || points.length < 2)
    throw new BrewingInputError('points', 'A calibration needs at least two standards.')
  points.forEach((point, index) => {
    requireFinite(point?.concentration, `points.${index}.concentration`, `The concentration of standard ${index + 1}`)
    requireFinite(point?.reading, `points.${index}.reading`, `The reading of standard ${index + 1}`)
  })
  const n = points.length
  const meanConcentration = points.reduce((sum, p) => sum + p.concentration, 0) / n
  const meanReading = points.reduce((sum, p) => sum + p.reading, 0) / n
  let sxx = 0
  let sxy = 0
  let syy = 0
  for (const { concentration, reading } of points) {
    const dx = concentration - meanConcentration
    const dy = reading - meanReading
    sxx += dx * dx
    sxy += dx * dy
    syy += dy * dy
  }
  if (sxx === 0)
    throw new BrewingInputError('points', 'The standards need at least two different concentrations.')
  const slope = sxy / sxx
  if (slope === 0 || syy === 0)
    throw new BrewingInputError('points', 'The readings do not change with concentration, so no calibration line can be drawn.')
  const intercept = meanReading - slope * meanConcentration
  let sse = 0
  for (const { concentration, reading } of points) {
    const residual = reading - (intercept + slope * concentration)
    sse += residual * residual
  }
  const degreesOfFreedom = n - 2
  const residualSd = degreesOfFreedom > 0 ? Math.sqrt(sse / degreesOfFreedom) : 0
  return {
    slope,
    intercept,
    n,
    rSquared: Math.max(0, 1 - sse / syy),
    residualSd,
    slopeSe: residualSd / Math.sqrt(sxx),
    interceptSe: residualSd * Math.sqrt(1 / n + (meanConcentration * meanConcentration) / sxx),
    meanConcentration,
    meanReading,
    sxx,
    degreesOfFreedom,
  }
}

/**
 * Inverse prediction: the concentration that gives this reading, `(reading − intercept) / slope`.
 * @param fit - a line from fitCalibration
 * @param reading - in the instrument's unit
 */
export function concentrationFromReading(fit: CalibrationFit, reading: number): number {
  requireFinite(reading, 'reading', 'The reading')
  return (reading - fit.intercept) / fit.slope
}

/**
 * Standard uncertainty of an inverse prediction from m replicate readings, the usual
 * calibration-curve formula s_x0 = (s_y/x / |b|) √(1/m + 1/n + (ȳ0 − ȳ)² / (b² Sxx)).
 * @param fit - a line from fitCalibration
 * @param reading - mean of the m replicate readings
 * @param replicates - m, how many readings were averaged (1 by default)
 */
export function inverseUncertainty(fit: CalibrationFit, reading: number, replicates = 1): number {
  requireFinite(reading, 'reading', 'The reading')
  if (!Number.isInteger(replicates) || replicates < 1)
    throw new BrewingInputError('replicates', 'The number of readings must be a whole number of one or more.')
  if (fit.degreesOfFreedom < 1)
    throw new BrewingInputError('points', 'Estimating the calibration\'s uncertainty needs at least three standards.')
  const offset = reading - fit.meanReading
  return (fit.residualSd / Math.abs(fit.slope))
    * Math.sqrt(1 / replicates + 1 / fit.n + (offset * offset) / (fit.slope * fit.slope * fit.sxx))
}

/**
 * The part of an inverse prediction's standard uncertainty that comes from the line alone,
 * (s_y/x / |b|) √(1/n + (ȳ0 − ȳ)² / (b² Sxx)): inverseUncertainty without the 1/m term of the new
 * readings, for when their scatter is counted separately from the instrument's repeatability.
 * @param fit - a line from fitCalibration with at least three standards
 * @param reading - the mean reading, in the instrument's unit
 */
export function lineUncertainty(fit: CalibrationFit, reading: number): number {
  requireFinite(reading, 'reading', 'The reading')
  if (fit.degreesOfFreedom < 1)
    throw new BrewingInputError('points', 'Estimating the calibration\'s uncertainty needs at least three standards.')
  const offset = reading - fit.meanReading
  return (fit.residualSd / Math.abs(fit.slope)) * Math.sqrt(1 / fit.n + (offset * offset) / (fit.slope * fit.slope * fit.sxx))
}

export interface CalibrationDiagnostics {
  /** Reading minus the line's prediction, one per standard, in the instrument's unit. */
  residuals: number[]
  /**
   * Externally studentised residuals: each residual against the line fitted without that standard,
   * t_i = e_i √((n − 3) / (SSE (1 − h_ii) − e_i²)). Empty with fewer than four standards.
   */
  studentisedResiduals: number[]
  /** Index of the standard whose studentised residual exceeds Student's t (95 %, n − 3 df), or null. */
  outlierIndex: number | null
  poorFit: boolean
  warnings: string[]
}

/** R² below this on a refractometer calibration means something went wrong (common practice). */
export const poorFitRSquared = 0.995

/** Two-sided 95 % points of Student's t for 1 to 10 degrees of freedom (standard t table). */
const studentT95 = [12.706, 4.303, 3.182, 2.776, 2.571, 2.447, 2.365, 2.306, 2.262, 2.228]
const studentT95Large = 1.96

function studentisedResiduals(points: readonly CalibrationPoint[], fit: CalibrationFit, residuals: number[]): number[] {
  const sse = residuals.reduce((sum, r) => sum + r * r, 0)
  const scale = Math.max(...points.map(p => Math.abs(p.reading)), 1)
  // A line through every standard (to rounding) has no outlier to find.
  if (Math.sqrt(sse / fit.n) <= 1e-12 * scale)
    return residuals.map(() => 0)
  return residuals.map((residual, index) => {
    const dx = points[index]!.concentration - fit.meanConcentration
    const leverage = 1 / fit.n + (dx * dx) / fit.sxx
    const rest = sse * (1 - leverage) - residual * residual
    if (rest <= 1e-12 * sse)
      return residual === 0 ? 0 : Math.sign(residual) * Number.MAX_VALUE
    return residual * Math.sqrt((fit.n - 3) / rest)
  })
}

/** Residuals for the residual plot, and the warnings a person should see before accepting a fit. */
export function diagnoseCalibration(points: readonly CalibrationPoint[], fit: CalibrationFit = fitCalibration(points)): CalibrationDiagnostics {
  const residuals = points.map(p => p.reading - (fit.intercept + fit.slope * p.concentration))
  const studentised = fit.n >= 4 ? studentisedResiduals(points, fit, residuals) : []
  const critical = studentT95[fit.n - 4] ?? studentT95Large
  let outlierIndex: number | null = null
  let largest = critical
  studentised.forEach((t, index) => {
    if (Math.abs(t) > largest) {
      largest = Math.abs(t)
      outlierIndex = index
    }
  })
  const poorFit = fit.rSquared < poorFitRSquared
  const warnings: string[] = []
  if (poorFit)
    warnings.push(`The line fits poorly (R² ${fit.rSquared.toFixed(4)}): check the standards and the lens, then measure again.`)
  if (outlierIndex !== null)
    warnings.push(`Standard ${outlierIndex + 1} sits far from the line the others draw: remake or re-read it.`)
  if (fit.degreesOfFreedom < 1)
    warnings.push('With only two standards the line cannot show its own uncertainty; add a third.')
  else if (fit.n < 4)
    warnings.push('With three standards a wrong one cannot be told apart from the rest; a fourth makes the check possible.')
  return { residuals, studentisedResiduals: studentised, outlierIndex, poorFit, warnings }
}
