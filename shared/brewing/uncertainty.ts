import { BrewingInputError, requireNonNegative, requirePositive, requireTdsPercent } from './errors'
import { decantedYield, immersionYield, percolationYield } from './extraction'

export type BrewMethod = 'percolation' | 'espresso' | 'immersion'

export interface YieldUncertaintyInput {
  method: BrewMethod
  tdsPercent: number
  /** Grams of ground coffee. */
  dose: number
  /** Grams of beverage (percolation and espresso; an immersion's poured-off beverage). */
  beverageMass?: number
  /** Grams of brew water (immersion). */
  waterMass?: number
  /** LRR in g/g, for an immersion yield from the poured-off beverage (taken as exact). */
  retainedRatio?: number
  /** Smallest step the scale shows, in grams (0.1 for most brew scales). */
  scaleResolution: number
  /** Each mass weighed as gross minus tare (two readings of the scale) rather than tared to zero. */
  byDifference?: boolean
  /** Standard deviation of a single strength reading, in %TDS (the refractometer's repeatability). */
  repeatabilityTdsPercent: number
  /** How many readings were averaged (1 by default). */
  readings?: number
  /** Standard uncertainty the calibration adds to the strength, in %TDS (e.g. inverseUncertainty). */
  calibrationTdsPercent?: number
}

export interface YieldUncertainty {
  /** Standard uncertainty (k = 1) of the strength, in %TDS. */
  tdsPercent: number
  /** Standard uncertainty (k = 1) of the extraction yield, in percentage points. */
  yieldPercent: number
  /** The same at k = 2 (about 95 % coverage), for the ± shown beside results. */
  expanded: { tdsPercent: number, yieldPercent: number }
  /** Standard uncertainty of one mass from the scale alone, in grams. */
  massGrams: number
  /** How much each input adds to the yield's uncertainty, in percentage points. */
  contributions: { strength: number, dose: number, liquid: number }
}

/**
 * Standard uncertainty of one scale reading from its resolution alone: a rectangular distribution
 * of half-width resolution/2 gives resolution/√12 (GUM, JCGM 100:2008, 4.3.7 and F.2.2.1).
 */
export function scaleReadingUncertainty(resolution: number): number {
  return requirePositive(resolution, 'scaleResolution', 'The scale resolution') / Math.sqrt(12)
}

/**
 * First-order (GUM law of propagation, uncorrelated inputs) uncertainty of strength and extraction
 * yield from the scale's resolution and the refractometer's repeatability.
 */
export function yieldUncertainty(input: YieldUncertaintyInput): YieldUncertainty {
  const tds = requireTdsPercent(input.tdsPercent)
  const dose = requirePositive(input.dose, 'dose', 'The dose')
  requireNonNegative(input.repeatabilityTdsPercent, 'repeatabilityTdsPercent', 'The refractometer repeatability')
  const readings = input.readings ?? 1
  if (!Number.isInteger(readings) || readings < 1)
    throw new BrewingInputError('readings', 'The number of readings must be a whole number of one or more.')
  const calibration = requireNonNegative(input.calibrationTdsPercent ?? 0, 'calibrationTdsPercent', 'The calibration uncertainty')

  const uTds = Math.sqrt(input.repeatabilityTdsPercent ** 2 / readings + calibration ** 2)
  const uMass = scaleReadingUncertainty(input.scaleResolution) * ((input.byDifference ?? true) ? Math.SQRT2 : 1)

  let dStrength: number
  let dDose: number
  let dLiquid: number
  if (input.method === 'immersion' && input.waterMass === undefined && input.beverageMass !== undefined) {
    const beverage = input.beverageMass
    const retained = requireNonNegative(input.retainedRatio ?? Number.NaN, 'retainedRatio', 'The retained liquid ratio (LRR)')
    const ey = decantedYield({ tdsPercent: tds, beverageMass: beverage, dose, retainedRatio: retained })
    // EY = TDS (B + L D) / D = TDS B / D + TDS L.
    dStrength = (beverage + retained * dose) / dose
    dLiquid = tds / dose
    dDose = -(ey - tds * retained) / dose
  }
  else if (input.method === 'immersion') {
    if (input.waterMass === undefined)
      throw new BrewingInputError('waterMass', 'An immersion brew needs the water mass.')
    const water = input.waterMass
    const ey = immersionYield({ tdsPercent: tds, waterMass: water, dose })
    const t = tds / 100
    // EY = 100 W t / ((1 − t) D): partial derivatives in percentage points per input unit.
    dStrength = water / (dose * (1 - t) ** 2)
    dLiquid = ey / water
    dDose = -ey / dose
  }
  else if (input.method === 'percolation' || input.method === 'espresso') {
    if (input.beverageMass === undefined)
      throw new BrewingInputError('beverageMass', 'A percolation or espresso brew needs the beverage mass.')
    const beverage = input.beverageMass
    const ey = percolationYield({ tdsPercent: tds, beverageMass: beverage, dose })
    // EY = TDS × B / D.
    dStrength = beverage / dose
    dLiquid = ey / beverage
    dDose = -ey / dose
  }
  else {
    throw new BrewingInputError('method', 'The method must be percolation, espresso or immersion.')
  }

  const contributions = {
    strength: Math.abs(dStrength) * uTds,
    dose: Math.abs(dDose) * uMass,
    liquid: Math.abs(dLiquid) * uMass,
  }
  const uYield = Math.hypot(contributions.strength, contributions.dose, contributions.liquid)
  return {
    tdsPercent: uTds,
    yieldPercent: uYield,
    expanded: { tdsPercent: 2 * uTds, yieldPercent: 2 * uYield },
    massGrams: uMass,
    contributions,
  }
}
