import { BrewingInputError, requireFinite, requireNonNegative, requirePositive } from './errors'

/**
 * Refractive index nD of aqueous sucrose solutions at 20 °C, 589 nm, relative to air, at 0–30 °Brix
 * (sucrose mass fraction, %). Source: ICUMSA 1974 international sucrose refractive index table, as
 * adopted in ICUMSA SPS-3; rows 10–30 agree within 1e-5 with OIV-MA-AS2-02 Table II.
 */
export const icumsaSucroseNd20: readonly (readonly [brix: number, nD: number])[] = [
  [0, 1.33299],
  [1, 1.33442],
  [2, 1.33586],
  [3, 1.33732],
  [4, 1.33879],
  [5, 1.34026],
  [6, 1.34175],
  [7, 1.34325],
  [8, 1.34477],
  [9, 1.34629],
  [10, 1.34782],
  [11, 1.34937],
  [12, 1.35093],
  [13, 1.35250],
  [14, 1.35408],
  [15, 1.35568],
  [16, 1.35729],
  [17, 1.35891],
  [18, 1.36054],
  [19, 1.36218],
  [20, 1.36384],
  [21, 1.36551],
  [22, 1.36720],
  [23, 1.36889],
  [24, 1.37060],
  [25, 1.37233],
  [26, 1.37406],
  [27, 1.37582],
  [28, 1.37758],
  [29, 1.37936],
  [30, 1.38115],
]

/** nD of pure water at 20 °C, 589 nm (ICUMSA table, row 0). */
export const waterNd20 = 1.33299

const first = icumsaSucroseNd20[0]!
const last = icumsaSucroseNd20[icumsaSucroseNd20.length - 1]!

/** Linear interpolation in the table from column `from` to column `to` (the standard's practice). */
function interpolate(value: number, from: 0 | 1, to: 0 | 1): number {
  for (let i = 1; i < icumsaSucroseNd20.length; i++) {
    const upper = icumsaSucroseNd20[i]!
    if (value <= upper[from]) {
      const lower = icumsaSucroseNd20[i - 1]!
      const fraction = (value - lower[from]) / (upper[from] - lower[from])
      return lower[to] + fraction * (upper[to] - lower[to])
    }
  }
  return last[to]
}

/**
 * Refractive index at 20 °C of a sucrose solution (ICUMSA table, linear interpolation).
 * @param brix - sucrose mass fraction in °Brix, 0 to 30
 */
export function brixToRefractiveIndex(brix: number): number {
  requireFinite(brix, 'brix', 'The °Brix value')
  if (brix < first[0] || brix > last[0])
    throw new BrewingInputError('brix', `The sucrose table covers ${first[0]} to ${last[0]} °Brix; ${brix} °Brix is outside it.`)
  return interpolate(brix, 0, 1)
}

/**
 * °Brix of a sucrose solution from its refractive index at 20 °C (ICUMSA table, interpolated).
 * @param refractiveIndex - nD at 20 °C, 1.33299 to 1.38115
 */
export function refractiveIndexToBrix(refractiveIndex: number): number {
  requireFinite(refractiveIndex, 'refractiveIndex', 'The refractive index')
  if (refractiveIndex < first[1] || refractiveIndex > last[1])
    throw new BrewingInputError('refractiveIndex', `The sucrose table covers nD ${first[1]} to ${last[1]}; ${refractiveIndex} is outside it.`)
  return interpolate(refractiveIndex, 1, 0)
}

/** Coffee %TDS per °Brix: about 0.85 (common practice; a coffee calibration beats it). */
export const defaultBrixFactor = 0.85

/**
 * Coffee strength from a °Brix reading by a fixed factor.
 * @param brix - the refractometer's °Brix reading of the coffee
 * @param factor - %TDS per °Brix (0.85 by default; the user can change it)
 * @returns strength in %TDS
 */
export function tdsFromBrix(brix: number, factor = defaultBrixFactor): number {
  requireNonNegative(brix, 'brix', 'The °Brix reading')
  requirePositive(factor, 'factor', 'The °Brix factor')
  if (factor > 1.5)
    throw new BrewingInputError('factor', 'A °Brix factor above 1.5 is not plausible for coffee; check it.')
  return brix * factor
}

export type ReadingKind = 'nD' | 'brix' | 'tds'

/**
 * What distilled water should read, and how far off a zero check may be: 0.00015 nD (about
 * 0.1 °Brix, the OIV method's resolution), 0.1 °Brix (OIV-MA-AS2-02), 0.03 %TDS (common practice).
 */
export const zeroTargets: Readonly<Record<ReadingKind, { expected: number, tolerance: number }>> = {
  nD: { expected: waterNd20, tolerance: 0.00015 },
  brix: { expected: 0, tolerance: 0.1 },
  tds: { expected: 0, tolerance: 0.03 },
}

export interface ZeroCheck {
  passed: boolean
  expected: number
  deviation: number
  tolerance: number
  message: string
}

/**
 * The distilled-water check at the start of every session.
 * @param reading - what the instrument shows for distilled water at 20 °C
 * @param kind - the instrument's unit
 * @param tolerance - allowed deviation in that unit (defaults in `zeroTargets`)
 */
export function zeroCheck(reading: number, kind: ReadingKind, tolerance = zeroTargets[kind]?.tolerance): ZeroCheck {
  requireFinite(reading, 'reading', 'The zero reading')
  const target = zeroTargets[kind]
  if (!target)
    throw new BrewingInputError('kind', 'The reading kind must be nD, °Brix or %TDS.')
  requirePositive(tolerance as number, 'tolerance', 'The zero tolerance')
  const deviation = reading - target.expected
  const passed = Math.abs(deviation) <= (tolerance as number) * (1 + 1e-9)
  return {
    passed,
    expected: target.expected,
    deviation,
    tolerance: tolerance as number,
    message: passed
      ? 'Zero check passed: the instrument reads distilled water correctly.'
      : 'Zero check failed: clean and dry the lens, let the water reach 20 °C, then zero the instrument and check again.',
  }
}

/**
 * How the refractive index of water drifts with temperature near 20 °C: about −0.0001 nD per °C
 * (IAPWS 1997 formulation at 589 nm: 1.33299 at 20 °C and 1.33250 at 25 °C; values from memory).
 */
export const ndPerDegreeNear20 = -0.0001

/**
 * What a sample at this temperature reads against one at 20 °C, in nD, and whether it matters:
 * more than 1 °C away, calibrate and measure at one temperature or let the instrument compensate.
 * @param temperatureC - temperature of the sample, 0 to 60 °C
 */
export function temperatureDrift(temperatureC: number): { offsetNd: number, significant: boolean } {
  requireFinite(temperatureC, 'temperatureC', 'The temperature')
  if (temperatureC < 0 || temperatureC > 60)
    throw new BrewingInputError('temperatureC', 'Type the temperature in °C, from 0 to 60.')
  return { offsetNd: (temperatureC - 20) * ndPerDegreeNear20, significant: Math.abs(temperatureC - 20) > 1 }
}
