import { BrewingInputError, requirePositive } from './errors'

/**
 * Brew ratio as grams of water per gram of coffee: 250 g of water on 15 g of coffee is 16.7 (1:16.7).
 * @param dose - grams of ground coffee
 * @param waterMass - grams of brew water
 */
export function brewRatio(dose: number, waterMass: number): number {
  requirePositive(dose, 'dose', 'The dose')
  requirePositive(waterMass, 'waterMass', 'The water mass')
  return waterMass / dose
}

/**
 * Grams of coffee per litre of water, taking 1 g of brew water as 1 mL (common practice; at 93 °C
 * water is about 4 % less dense, which the trade ignores for this figure).
 */
export function gramsPerLitre(dose: number, waterMass: number): number {
  return 1000 / brewRatio(dose, waterMass)
}

/** A brew ratio (water per coffee) from grams per litre: 60 g/L is 1:16.7. */
export function ratioFromGramsPerLitre(gramsPerLitreValue: number): number {
  requirePositive(gramsPerLitreValue, 'gramsPerLitre', 'Grams per litre')
  return 1000 / gramsPerLitreValue
}

/** Grams per litre from a brew ratio (water per coffee): 1:16.7 is 60 g/L. */
export function gramsPerLitreFromRatio(ratio: number): number {
  requirePositive(ratio, 'ratio', 'The brew ratio')
  return 1000 / ratio
}

/** A ratio as people write it: `1:16.7`. */
export function formatRatio(ratio: number, decimals = 1): string {
  requirePositive(ratio, 'ratio', 'The brew ratio')
  return `1:${ratio.toFixed(decimals)}`
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
