import type { BrewInput } from '../../shared/brewing'
import { computeBrew, fitCalibration } from '../../shared/brewing'

/** The line and its statistics, recomputed from the standards; the phone's own fit is never trusted. */
export function deriveCalibration(data: Record<string, unknown>): Record<string, unknown> {
  return { fit: fitCalibration(data.points as { concentration: number, reading: number }[]) }
}

export type CalibrationForBrew = NonNullable<BrewInput['calibration']>

/** Strength and extraction of a stored brew, with the same function the phone shows live. */
export function deriveBrew(data: Record<string, unknown>, readingValues: number[], calibration: CalibrationForBrew | null): Record<string, unknown> {
  // The stored data was validated by the brew schema, whose fields are BrewInput's.
  const result = computeBrew({ ...(data as unknown as Omit<BrewInput, 'readings' | 'calibration'>), readings: readingValues, calibration })
  return {
    tdsPercent: result.tdsPercent,
    yieldPercent: result.yieldPercent,
    ...(result.missing.length ? { missing: result.missing } : {}),
    ...(result.problem ? { problem: result.problem } : {}),
  }
}
