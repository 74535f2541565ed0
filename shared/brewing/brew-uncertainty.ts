import type { BrewInput, BrewResult } from './brew'
import { lineUncertainty } from './calibration'
import { summarizeReadings } from './readings'
import { defaultBrixFactor } from './sucrose'
import { yieldUncertainty } from './uncertainty'

export interface BrewUncertaintyOptions {
  /** Smallest step of the scale, in grams. */
  scaleResolution: number
  /** Each mass read as gross and tare (two scale readings) rather than on a tared scale. */
  byDifference: boolean
  /** Standard deviation of one reading of one sample, in the readings' own unit (nD, °Brix or %TDS). */
  repeatability: number
}

export interface BrewUncertainty {
  /** Expanded uncertainty (k = 2, about 95 %) of the strength, in %TDS. */
  tdsPercent: number
  /** Expanded uncertainty (k = 2) of the extraction yield, in percentage points. */
  yieldPercent: number
  /** What the ± leaves out, in words for the result panel. */
  omissions: string[]
}

/**
 * The ± beside a brew's result: the refractometer's repeatability carried into %TDS (through the
 * calibration line's slope or the °Brix factor), the calibration line's own uncertainty when it
 * has three or more standards, and the scale's resolution, propagated to the yield (GUM, first
 * order). Null until the brew has a result.
 */
export function brewUncertainty(input: BrewInput, result: BrewResult, options: BrewUncertaintyOptions): BrewUncertainty | null {
  if (result.tdsPercent === null || result.yieldPercent === null || result.dose === null || result.problem || input.readings.length === 0)
    return null
  const omissions: string[] = []
  const factor = input.brixFactor ?? defaultBrixFactor
  let perReading = options.repeatability
  let line = 0
  if (input.strengthSource === 'brix-factor') {
    perReading *= factor
  }
  else if (input.strengthSource === 'calibration' && input.calibration) {
    const { fit, standardUnit } = input.calibration
    const scale = standardUnit === 'brix' ? factor : 1
    perReading = (perReading / Math.abs(fit.slope)) * scale
    if (fit.degreesOfFreedom >= 1)
      line = lineUncertainty(fit, summarizeReadings(input.readings).mean) * scale
    else
      omissions.push('the calibration line\'s own uncertainty (it has only two standards)')
  }
  if (input.strengthSource !== 'direct' && (input.strengthSource === 'brix-factor' || input.calibration?.standardUnit === 'brix'))
    omissions.push('the uncertainty of the °Brix factor')
  const basis = result.yieldBasis
  if (basis === 'water-estimate' || basis === 'immersion-decanted')
    omissions.push('the uncertainty of the LRR')
  const u = yieldUncertainty({
    method: input.method,
    tdsPercent: result.tdsPercent,
    dose: result.dose,
    beverageMass: basis === 'immersion-water' ? undefined : result.beverageMass ?? undefined,
    waterMass: basis === 'immersion-water' ? input.waterMass ?? undefined : undefined,
    retainedRatio: result.retainedRatio ?? undefined,
    scaleResolution: options.scaleResolution,
    byDifference: options.byDifference,
    repeatabilityTdsPercent: perReading,
    readings: input.readings.length,
    calibrationTdsPercent: line,
  })
  return { ...u.expanded, omissions }
}
