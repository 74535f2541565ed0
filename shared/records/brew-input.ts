import type { BrewInput, CalibrationFit } from '../brewing'
import type { EntityData } from '../schemas/entities'
import { BrewingInputError, fitCalibration } from '../brewing'

/** A calibration's line, fitted from its standards; null when they cannot give one. */
export function lineOf(calibration: Pick<EntityData<'calibration'>, 'points'> | null | undefined): CalibrationFit | null {
  if (!calibration)
    return null
  try {
    return fitCalibration(calibration.points)
  }
  catch (error) {
    if (error instanceof BrewingInputError)
      return null
    throw error
  }
}

/** A stored reading, as the result needs it. */
export interface ReadingValue { id: string, value: number }

/**
 * A stored brew as the core's input: its masses and settings, its readings but the set-aside ones,
 * and the line of the calibration it went through. The one path from a record to a result, on the
 * phone and on the server alike (the server never takes a phone's figures).
 */
export function brewInputOf(brew: EntityData<'brew'>, readings: readonly ReadingValue[], calibration: Pick<EntityData<'calibration'>, 'points' | 'standardUnit'> | null | undefined): BrewInput {
  const excluded = new Set(brew.excludedReadingIds)
  const fit = lineOf(calibration)
  return {
    method: brew.method,
    strengthSource: brew.strengthSource,
    brixFactor: brew.brixFactor,
    dose: brew.dose,
    doseGross: brew.doseGross,
    doseTare: brew.doseTare,
    beverageMass: brew.beverageMass,
    beverageGross: brew.beverageGross,
    beverageTare: brew.beverageTare,
    waterMass: brew.waterMass,
    retainedRatio: brew.retainedRatio,
    readings: readings.filter(reading => !excluded.has(reading.id)).map(reading => reading.value),
    calibration: fit && calibration ? { fit, standardUnit: calibration.standardUnit } : null,
  }
}

/** Whether a brew's masses were weighed as gross and tare (else as net masses). */
export const weighedByDifference = (brew: Pick<EntityData<'brew'>, 'doseGross' | 'beverageGross'>): boolean => brew.doseGross != null || brew.beverageGross != null
