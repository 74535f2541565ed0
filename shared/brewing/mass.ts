import { BrewingInputError, requireFinite, requireNonNegative, requirePositive } from './errors'

/**
 * Net mass weighed by difference: vessel with contents, minus the empty vessel.
 * @param gross - grams of vessel plus contents
 * @param tare - grams of the empty vessel
 * @returns grams of contents
 */
export function massByDifference(gross: number, tare: number): number {
  requireNonNegative(gross, 'gross', 'The gross weight')
  requireNonNegative(tare, 'tare', 'The tare weight')
  if (gross < tare)
    throw new BrewingInputError('gross', 'The gross weight is lighter than the tare: the vessel must be weighed empty first, then full.')
  return gross - tare
}

/**
 * Dose on a dry basis: the ground coffee without its water.
 * @param dose - grams of ground coffee as weighed
 * @param moisturePercent - moisture of the grounds, % by mass (0 to below 100)
 * @returns grams of dry coffee solids
 */
export function dryDose(dose: number, moisturePercent: number): number {
  requirePositive(dose, 'dose', 'The dose')
  requireFinite(moisturePercent, 'moisturePercent', 'The moisture')
  if (moisturePercent < 0 || moisturePercent >= 100)
    throw new BrewingInputError('moisturePercent', 'The moisture must be at least 0 % and below 100 %.')
  return dose * (1 - moisturePercent / 100)
}
