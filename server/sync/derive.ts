import type { CalibrationFit } from '../../shared/brewing'
import { beverageFromWater, BrewingInputError, concentrationFromReading, defaultBrixFactor, defaultRetainedRatio, fitCalibration, immersionYield, massByDifference, percolationYield, summarizeReadings, tdsFromBrix } from '../../shared/brewing'

/** The line and its statistics, recomputed from the standards; the phone's own fit is never trusted. */
export function deriveCalibration(data: Record<string, unknown>): Record<string, unknown> {
  const fit = fitCalibration(data.points as { concentration: number, reading: number }[])
  return { fit }
}

interface BrewInputs {
  method: 'percolation' | 'espresso' | 'immersion'
  strengthSource: 'calibration' | 'brix-factor' | 'direct'
  brixFactor: number | null
  dose: number | null
  doseGross: number | null
  doseTare: number | null
  beverageMass: number | null
  beverageGross: number | null
  beverageTare: number | null
  waterMass: number | null
  retainedRatio: number | null
}

export interface CalibrationForBrew { fit: CalibrationFit, standardUnit: 'brix' | 'tds' }

function net(mass: number | null, gross: number | null, tare: number | null): number | null {
  return mass ?? (gross !== null && tare !== null ? massByDifference(gross, tare) : null)
}

/**
 * Strength and extraction of a brew from its readings and masses, as shared/brewing computes them on
 * the phone. What cannot be computed yet (no readings, a missing mass) is null with the reason.
 */
export function deriveBrew(data: Record<string, unknown>, readingValues: number[], calibration: CalibrationForBrew | null): Record<string, unknown> {
  const brew = data as unknown as BrewInputs
  try {
    if (readingValues.length === 0)
      return { tdsPercent: null, yieldPercent: null, missing: 'readings' }
    const mean = summarizeReadings(readingValues).mean
    let tdsPercent: number
    if (brew.strengthSource === 'direct') {
      tdsPercent = mean
    }
    else if (brew.strengthSource === 'brix-factor') {
      tdsPercent = tdsFromBrix(mean, brew.brixFactor ?? defaultBrixFactor)
    }
    else {
      if (!calibration)
        return { tdsPercent: null, yieldPercent: null, missing: 'calibration' }
      const concentration = concentrationFromReading(calibration.fit, mean)
      tdsPercent = calibration.standardUnit === 'brix' ? tdsFromBrix(concentration, brew.brixFactor ?? defaultBrixFactor) : concentration
    }
    const dose = net(brew.dose, brew.doseGross, brew.doseTare)
    if (dose === null)
      return { tdsPercent, yieldPercent: null, missing: 'dose' }
    if (brew.method === 'immersion') {
      if (brew.waterMass === null)
        return { tdsPercent, yieldPercent: null, missing: 'waterMass' }
      return { tdsPercent, yieldPercent: immersionYield({ tdsPercent, waterMass: brew.waterMass, dose }) }
    }
    let beverage = net(brew.beverageMass, brew.beverageGross, brew.beverageTare)
    if (beverage === null && brew.waterMass !== null)
      beverage = beverageFromWater({ waterMass: brew.waterMass, dose, retainedRatio: brew.retainedRatio ?? defaultRetainedRatio.percolation })
    if (beverage === null)
      return { tdsPercent, yieldPercent: null, missing: 'beverageMass' }
    return { tdsPercent, yieldPercent: percolationYield({ tdsPercent, beverageMass: beverage, dose }) }
  }
  catch (error) {
    if (error instanceof BrewingInputError)
      return { tdsPercent: null, yieldPercent: null, problem: { field: error.field, message: error.message } }
    throw error
  }
}
