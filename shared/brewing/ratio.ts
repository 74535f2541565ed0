import type { BrewResult } from './brew'
import { BrewingInputError, requirePositive } from './errors'
import { roundHalfUp } from './rounding'

// One brew ratio everywhere: grams of beverage per gram of coffee. It is the one the control chart
// draws (strength = extraction / ratio, so a line of equal ratio is a line of equal EY / TDS), the
// one an espresso is pulled to (1:2), and the one the verdict's advice moves. The water a recipe
// pours is shown as a mass of its own, never as a second ratio.

/** How the brew ratio's unit is written on every screen and in every export. */
export const brewRatioUnit = 'grams of beverage per gram of coffee'

/**
 * Brew ratio as grams of beverage per gram of coffee: 36 g from 18 g is 2.0 (1:2.0).
 * @param dose - grams of ground coffee
 * @param beverageMass - grams of beverage
 */
export function brewRatio(dose: number, beverageMass: number): number {
  requirePositive(dose, 'dose', 'The dose')
  requirePositive(beverageMass, 'beverageMass', 'The beverage mass')
  return beverageMass / dose
}

/** A brew's ratio, and whether it rests on an estimate (a beverage reckoned from the water). */
export interface BrewRatio { ratio: number, estimated: boolean }

/**
 * The brew ratio of a measured brew, with the beverage its mass balance counts, so the brew sits on
 * the chart's line of this ratio: the weighed beverage (percolation, espresso), the water less what
 * the grounds hold when no beverage was weighed, an immersion's poured-off beverage plus the liquid
 * left in the grounds (LRR × dose), or a full immersion's water with the solids it dissolved,
 * W / (1 − TDS) (without a strength yet: the water alone, an estimate). Null until the masses decide.
 * @param result - the core's result for the brew (computeBrew)
 * @param waterMass - grams of brew water, when the method uses it
 */
export function brewRatioOf(result: Pick<BrewResult, 'dose' | 'beverageMass' | 'beverageEstimated' | 'yieldBasis' | 'retainedRatio' | 'tdsPercent'>, waterMass: number | null): BrewRatio | null {
  const { dose, beverageMass, yieldBasis, tdsPercent } = result
  if (dose === null || dose <= 0 || yieldBasis === null)
    return null
  if (yieldBasis === 'immersion-water') {
    if (waterMass === null || waterMass <= 0)
      return null
    const known = tdsPercent !== null && tdsPercent > 0 && tdsPercent < 100
    return { ratio: (known ? waterMass / (1 - tdsPercent / 100) : waterMass) / dose, estimated: !known }
  }
  if (beverageMass === null || beverageMass <= 0)
    return null
  const held = yieldBasis === 'immersion-decanted' ? (result.retainedRatio ?? 0) * dose : 0
  return { ratio: (beverageMass + held) / dose, estimated: result.beverageEstimated }
}

/**
 * Grams of coffee per litre of brew water, taking 1 g of water as 1 mL (common practice; at 93 °C
 * water is about 4 % less dense, which the trade ignores for this figure). A dosing figure of its
 * own (the SCAA standard's 55 g/L), not a brew ratio.
 */
export function gramsPerLitre(dose: number, waterMass: number): number {
  requirePositive(dose, 'dose', 'The dose')
  requirePositive(waterMass, 'waterMass', 'The water mass')
  return (1000 * dose) / waterMass
}

/** A brew ratio as people write it, half up: `1:16.0`. */
export function formatRatio(ratio: number, decimals = 1): string {
  requirePositive(ratio, 'ratio', 'The brew ratio')
  return `1:${roundHalfUp(ratio, decimals).toFixed(decimals)}`
}

/** The brew ratio in words, the same everywhere: "1:16.0 (grams of beverage per gram of coffee)". */
export function ratioText(ratio: BrewRatio | number): string {
  const { ratio: value, estimated } = typeof ratio === 'number' ? { ratio, estimated: false } : ratio
  return `${estimated ? 'about ' : ''}${formatRatio(value)} (${brewRatioUnit})`
}

/** SCA cupping protocol: 8.25 g ± 0.25 g of coffee per 150 mL of water, 0.055 g/mL. */
export const cuppingRatio = { gramsPerMl: 8.25 / 150, toleranceGramsPerMl: 0.25 / 150 } as const

/**
 * Coffee for one cupping bowl at the SCA ratio, with the tolerance the protocol allows.
 * @param waterMl - mL of water the bowl holds
 * @returns grams of coffee, and the acceptable range
 */
export function cuppingDose(waterMl: number): { dose: number, min: number, max: number } {
  requirePositive(waterMl, 'waterMl', 'The bowl\'s water volume')
  if (waterMl > 1000)
    throw new BrewingInputError('waterMl', 'A cupping bowl holds far less than a litre; check the volume.')
  return {
    dose: waterMl * cuppingRatio.gramsPerMl,
    min: waterMl * (cuppingRatio.gramsPerMl - cuppingRatio.toleranceGramsPerMl),
    max: waterMl * (cuppingRatio.gramsPerMl + cuppingRatio.toleranceGramsPerMl),
  }
}
