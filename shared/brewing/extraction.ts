import { BrewingInputError, requireNonNegative, requirePositive, requireTdsPercent } from './errors'

/**
 * Liquid retained per gram of grounds (LRR, g/g), common practice: about 2.0 for paper-filter
 * percolation (2 to 2.5 seen), about 3 for a decanted immersion brew.
 */
export const defaultRetainedRatio = { percolation: 2.0, immersion: 3.0 } as const

/**
 * Extraction yield of percolation and espresso by mass balance: EY = TDS × beverage / dose.
 * @param input - the brew's figures
 * @param input.tdsPercent - strength of the beverage, %TDS
 * @param input.beverageMass - grams of beverage in the cup or carafe
 * @param input.dose - grams of ground coffee
 * @returns extraction yield in %
 */
export function percolationYield(input: { tdsPercent: number, beverageMass: number, dose: number }): number {
  requireTdsPercent(input.tdsPercent)
  requirePositive(input.beverageMass, 'beverageMass', 'The beverage mass')
  requirePositive(input.dose, 'dose', 'The dose')
  return (input.tdsPercent * input.beverageMass) / input.dose
}

/**
 * Dissolved solids of a full-immersion brew from the water used: S = W × TDS / (1 − TDS), since the
 * liquid that holds the solids is the water plus the solids themselves.
 * @param input - the brew's figures
 * @param input.tdsPercent - strength, %TDS
 * @param input.waterMass - grams of brew water
 * @returns grams of dissolved solids
 */
export function immersionSolids(input: { tdsPercent: number, waterMass: number }): number {
  const fraction = requireTdsPercent(input.tdsPercent) / 100
  requirePositive(input.waterMass, 'waterMass', 'The water mass')
  return (input.waterMass * fraction) / (1 - fraction)
}

/**
 * Extraction yield of full immersion with no beverage weighed: EY = W × TDS / ((1 − TDS) × dose).
 * @param input - the brew's figures
 * @param input.tdsPercent - strength, %TDS
 * @param input.waterMass - grams of brew water
 * @param input.dose - grams of ground coffee
 * @returns extraction yield in %
 */
export function immersionYield(input: { tdsPercent: number, waterMass: number, dose: number }): number {
  requirePositive(input.dose, 'dose', 'The dose')
  return (immersionSolids(input) / input.dose) * 100
}

/**
 * Extraction yield of an immersion brew whose beverage was decanted and weighed, counting the
 * liquid left in the grounds: EY = TDS × (beverage + LRR × dose) / dose.
 * @param input - the brew's figures
 * @param input.tdsPercent - strength of the decanted beverage, %TDS
 * @param input.beverageMass - grams of beverage poured off
 * @param input.dose - grams of ground coffee
 * @param input.retainedRatio - grams of liquid retained per gram of grounds (LRR)
 * @returns extraction yield in %
 */
export function decantedYield(input: { tdsPercent: number, beverageMass: number, dose: number, retainedRatio: number }): number {
  requireTdsPercent(input.tdsPercent)
  requirePositive(input.beverageMass, 'beverageMass', 'The beverage mass')
  requirePositive(input.dose, 'dose', 'The dose')
  requireNonNegative(input.retainedRatio, 'retainedRatio', 'The retained liquid ratio (LRR)')
  return (input.tdsPercent * (input.beverageMass + input.retainedRatio * input.dose)) / input.dose
}

/**
 * Beverage mass estimated from the water when it was not weighed: W − LRR × dose.
 * @param input - the brew's figures
 * @param input.waterMass - grams of brew water
 * @param input.dose - grams of ground coffee
 * @param input.retainedRatio - LRR, grams of liquid retained per gram of grounds
 * @returns grams of beverage
 */
export function beverageFromWater(input: { waterMass: number, dose: number, retainedRatio: number }): number {
  requirePositive(input.waterMass, 'waterMass', 'The water mass')
  requirePositive(input.dose, 'dose', 'The dose')
  requireNonNegative(input.retainedRatio, 'retainedRatio', 'The retained liquid ratio (LRR)')
  const beverage = input.waterMass - input.retainedRatio * input.dose
  if (beverage <= 0)
    throw new BrewingInputError('waterMass', 'With this much coffee the grounds would hold all the water: no beverage is left.')
  return beverage
}
