import { BrewingInputError, requireFinite } from './errors'

/**
 * Critical values of Dixon's Q at 95 % confidence for 3 to 10 readings. Source: Rorabacher,
 * Anal. Chem. 63 (1991) 139–146, Table 1 (r10, two-sided 95 %); values from memory of that table.
 */
const dixonQ95 = [0.970, 0.829, 0.710, 0.625, 0.568, 0.526, 0.493, 0.466]

export interface ReadingsSummary {
  n: number
  mean: number
  /** Sample standard deviation (n − 1); 0 for a single reading. */
  sd: number
  /** Standard error of the mean, sd / √n. */
  standardError: number
  min: number
  max: number
  range: number
  /** The reading Dixon's Q test marks as an outlier (95 %, 3 to 10 readings), or null. */
  outlier: { index: number, value: number, q: number, critical: number } | null
}

/**
 * Mean and spread of several readings of one sample, with Dixon's Q test on the most extreme one.
 * The mean includes every reading: leaving a flagged one out is the person's decision.
 * @param values - the readings, in the instrument's unit
 */
export function summarizeReadings(values: readonly number[]): ReadingsSummary {
  if (!Array.isArray(values) || values.length === 0)
    throw new BrewingInputError('readings', 'Add at least one reading.')
  values.forEach((value, index) => requireFinite(value, `readings.${index}`, `Reading ${index + 1}`))
  const n = values.length
  const mean = values.reduce((sum, v) => sum + v, 0) / n
  const sd = n > 1 ? Math.sqrt(values.reduce((sum, v) => sum + (v - mean) ** 2, 0) / (n - 1)) : 0
  const min = Math.min(...values)
  const max = Math.max(...values)
  return { n, mean, sd, standardError: sd / Math.sqrt(n), min, max, range: max - min, outlier: dixonOutlier(values) }
}

function dixonOutlier(values: readonly number[]): ReadingsSummary['outlier'] {
  const critical = dixonQ95[values.length - 3]
  if (critical === undefined)
    return null
  const sorted = values.map((value, index) => ({ value, index })).sort((a, b) => a.value - b.value)
  const range = sorted[sorted.length - 1]!.value - sorted[0]!.value
  if (range === 0)
    return null
  const lowGap = sorted[1]!.value - sorted[0]!.value
  const highGap = sorted[sorted.length - 1]!.value - sorted[sorted.length - 2]!.value
  const suspect = highGap >= lowGap ? sorted[sorted.length - 1]! : sorted[0]!
  const q = Math.max(lowGap, highGap) / range
  return q > critical ? { index: suspect.index, value: suspect.value, q, critical } : null
}

/**
 * The range a reading of each kind must fall in to be a reading of brewed coffee or of a sucrose
 * standard, with an example for the hint. Refractive index: water reads 1.33299 at 20 °C (ICUMSA
 * table, row 0) and 85 °Brix sucrose about 1.503 (the full ICUMSA table, from memory); °Brix up to
 * 85, the table's span; %TDS up to 30, past the strongest espresso (common practice). A zero check
 * may read a hair below zero.
 */
export const readingRanges = {
  nD: { min: 1.3, max: 1.7, example: '1.3357', step: 0.00001 },
  brix: { min: -1, max: 85, example: '1.62', step: 0.01 },
  tds: { min: -1, max: 30, example: '1.38', step: 0.01 },
} as const satisfies Record<'nD' | 'brix' | 'tds', { min: number, max: number, example: string, step: number }>
// `step` is the display step of a reading typed without an instrument: what coffee refractometers
// show for %TDS and °Brix, and a bench refractometer's fifth decimal of nD (common practice).
