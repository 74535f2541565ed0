import type { CalibrationFit } from './calibration'
import type { BrewMethod } from './uncertainty'
import { concentrationFromReading } from './calibration'
import { BrewingInputError } from './errors'
import { beverageFromWater, decantedYield, defaultRetainedRatio, immersionYield, percolationYield } from './extraction'
import { massByDifference } from './mass'
import { summarizeReadings } from './readings'
import { defaultBrixFactor, tdsFromBrix } from './sucrose'

export interface BrewInput {
  method: BrewMethod
  /** How readings become %TDS: through a calibration, by a °Brix factor, or already %TDS. */
  strengthSource: 'calibration' | 'brix-factor' | 'direct'
  readings: readonly number[]
  brixFactor?: number | null
  /** The active calibration, and what its standards' concentrations are in. */
  calibration?: { fit: CalibrationFit, standardUnit: 'brix' | 'tds' } | null
  dose?: number | null
  doseGross?: number | null
  doseTare?: number | null
  beverageMass?: number | null
  beverageGross?: number | null
  beverageTare?: number | null
  waterMass?: number | null
  retainedRatio?: number | null
}

/**
 * Which mass balance gave the extraction yield: the weighed beverage; a beverage estimated from the
 * water and the LRR; a full immersion's water; or an immersion's poured-off beverage plus the LRR.
 */
export type YieldBasis = 'beverage' | 'water-estimate' | 'immersion-water' | 'immersion-decanted'

export interface BrewResult {
  tdsPercent: number | null
  yieldPercent: number | null
  /** Net grams used, as computed (by difference where weighed so). */
  dose: number | null
  beverageMass: number | null
  /** Whether the beverage was estimated from the water and the LRR rather than weighed. */
  beverageEstimated: boolean
  /** How the yield was (or will be) computed; null until the masses decide it. */
  yieldBasis: YieldBasis | null
  /** The LRR used (g/g), given or the method's common-practice default; null when none was needed. */
  retainedRatio: number | null
  /** What is still needed, in the order a person fills the form. */
  missing: ('readings' | 'calibration' | 'dose' | 'beverageMass' | 'waterMass')[]
  /** An input the core refused, with the field and the sentence to show beside it. */
  problem: { field: string, message: string } | null
}

function net(mass: number | null | undefined, gross: number | null | undefined, tare: number | null | undefined): number | null {
  return mass ?? (gross != null && tare != null ? massByDifference(gross, tare) : null)
}

/**
 * Strength and extraction yield of one brew from its readings and masses: the same function on the
 * phone (live result) and on the server (which never trusts the phone's numbers).
 */
export function computeBrew(input: BrewInput): BrewResult {
  const result: BrewResult = { tdsPercent: null, yieldPercent: null, dose: null, beverageMass: null, beverageEstimated: false, yieldBasis: null, retainedRatio: null, missing: [], problem: null }
  try {
    if (input.readings.length > 0) {
      const mean = summarizeReadings(input.readings).mean
      if (input.strengthSource === 'direct') {
        result.tdsPercent = mean
      }
      else if (input.strengthSource === 'brix-factor') {
        result.tdsPercent = tdsFromBrix(mean, input.brixFactor ?? defaultBrixFactor)
      }
      else if (input.calibration) {
        const concentration = concentrationFromReading(input.calibration.fit, mean)
        result.tdsPercent = input.calibration.standardUnit === 'brix' ? tdsFromBrix(concentration, input.brixFactor ?? defaultBrixFactor) : concentration
      }
      else {
        result.missing.push('calibration')
      }
    }
    else {
      result.missing.push('readings')
    }
    result.dose = net(input.dose, input.doseGross, input.doseTare)
    if (result.dose === null)
      result.missing.push('dose')
    result.beverageMass = net(input.beverageMass, input.beverageGross, input.beverageTare)
    if (input.method === 'immersion')
      immersion(input, result)
    else
      percolation(input, result)
  }
  catch (error) {
    if (!(error instanceof BrewingInputError))
      throw error
    return { ...result, yieldPercent: null, problem: { field: error.field, message: error.message } }
  }
  return result
}

const ready = (result: BrewResult): boolean => result.dose !== null && result.tdsPercent !== null

/**
 * Full immersion: from the water when it was weighed (the whole liquid is one well-mixed brew);
 * otherwise from the beverage poured off plus the liquid the grounds hold (LRR, 3 g/g by default).
 */
function immersion(input: BrewInput, result: BrewResult): void {
  if (input.waterMass != null) {
    result.yieldBasis = 'immersion-water'
    if (ready(result))
      result.yieldPercent = immersionYield({ tdsPercent: result.tdsPercent!, waterMass: input.waterMass, dose: result.dose! })
    return
  }
  if (result.beverageMass === null) {
    result.missing.push('waterMass')
    return
  }
  result.yieldBasis = 'immersion-decanted'
  result.retainedRatio = input.retainedRatio ?? defaultRetainedRatio.immersion
  if (ready(result))
    result.yieldPercent = decantedYield({ tdsPercent: result.tdsPercent!, beverageMass: result.beverageMass, dose: result.dose!, retainedRatio: result.retainedRatio })
}

/** Percolation and espresso: the weighed beverage, or one estimated from the water and the LRR. */
function percolation(input: BrewInput, result: BrewResult): void {
  if (result.beverageMass === null && input.waterMass != null && result.dose !== null) {
    result.retainedRatio = input.retainedRatio ?? defaultRetainedRatio.percolation
    result.beverageMass = beverageFromWater({ waterMass: input.waterMass, dose: result.dose, retainedRatio: result.retainedRatio })
    result.beverageEstimated = true
  }
  if (result.beverageMass === null) {
    result.missing.push('beverageMass')
    return
  }
  result.yieldBasis = result.beverageEstimated ? 'water-estimate' : 'beverage'
  if (ready(result))
    result.yieldPercent = percolationYield({ tdsPercent: result.tdsPercent!, beverageMass: result.beverageMass, dose: result.dose! })
}
