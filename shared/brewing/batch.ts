import type { DialInMethod } from './dialin'
import { BrewingInputError, requireNonNegative, requirePositive } from './errors'
import { defaultRetainedRatio } from './extraction'

/** A recipe as one brew of it: the masses it is written with. */
export interface RecipeMasses {
  method: DialInMethod
  /** Grams of coffee. */
  dose: number
  /** Grams of brew water; null for espresso. */
  waterMass: number | null
  /** Grams of beverage aimed at; null when the water sets the recipe. */
  beverageMass: number | null
  /** LRR (g/g) the recipe counts on; null: the method's common-practice one. */
  retainedRatio: number | null
}

/** How big the batch is: a number of cups (or shots) of a size, or litres of beverage. */
export type BatchSize = { cups: number, cupMass: number } | { litres: number }

export interface Batch {
  dose: number
  /** Grams of water to brew with; null for espresso (pulled shot by shot). */
  waterMass: number | null
  /** Grams of beverage the batch gives. */
  beverageMass: number
  /** Grams of liquid the spent grounds keep (LRR × dose). */
  retained: number
  /** LRR (g/g) used for the batch. */
  retainedRatio: number
  /** Beverage per gram of coffee, the recipe's (so strength and extraction stay the recipe's). */
  brewRatio: number
}

/**
 * Grams of beverage in a litre, taking 1 mL of brewed coffee as 1 g (common practice: at filter
 * strength it is within 1 % of that).
 */
export const gramsPerLitreOfBeverage = 1000

/**
 * A recipe scaled to a batch by mass balance: water in = beverage out + liquid kept by the grounds
 * (LRR × dose), evaporation left aside. The batch keeps the recipe's brew ratio (beverage per gram
 * of coffee), so at the same extraction it has the recipe's strength; the water is then the
 * beverage wanted plus what the larger bed of grounds keeps. Scaling the water alone would come
 * up short by the LRR of every extra gram. An espresso batch is so many shots of the recipe.
 * @param recipe - the recipe's masses (one brew)
 * @param size - the batch: cups of a size in grams, or litres of beverage
 * @param batchRetainedRatio - LRR (g/g) of the batch brewer, when it differs from the recipe's
 */
export function scaleRecipe(recipe: RecipeMasses, size: BatchSize, batchRetainedRatio?: number | null): Batch {
  requirePositive(recipe.dose, 'dose', 'The dose')
  const recipeLrr = requireNonNegative(recipe.retainedRatio ?? defaultRetainedRatio[recipe.method === 'immersion' ? 'immersion' : 'percolation'], 'retainedRatio', 'The retained liquid ratio (LRR)')
  let wanted: number
  if ('cups' in size) {
    if (!Number.isInteger(size.cups) || size.cups < 1 || size.cups > 10_000)
      throw new BrewingInputError('cups', 'The number of cups must be a whole number from 1 to 10 000.')
    wanted = size.cups * requirePositive(size.cupMass, 'cupMass', 'The size of a cup')
  }
  else {
    wanted = requirePositive(size.litres, 'litres', 'The litres of beverage') * gramsPerLitreOfBeverage
  }
  if (recipe.method === 'espresso') {
    const shot = requirePositive(recipe.beverageMass ?? Number.NaN, 'beverageMass', 'The espresso\'s beverage mass')
    // Litres of espresso are whole shots, enough to fill them.
    const shots = 'cups' in size ? size.cups : Math.ceil(wanted / shot - 1e-9)
    return { dose: recipe.dose * shots, waterMass: null, beverageMass: shot * shots, retained: 0, retainedRatio: 0, brewRatio: shot / recipe.dose }
  }
  const beverage = recipe.beverageMass ?? requirePositive(recipe.waterMass ?? Number.NaN, 'waterMass', 'The recipe\'s water') - recipeLrr * recipe.dose
  if (!(beverage > 0))
    throw new BrewingInputError('waterMass', 'With this much coffee the grounds would hold all the recipe\'s water: no beverage is left.')
  const brewRatio = beverage / recipe.dose
  const lrr = requireNonNegative(batchRetainedRatio ?? recipeLrr, 'batchRetainedRatio', 'The batch brewer\'s LRR')
  const dose = wanted / brewRatio
  return { dose, waterMass: wanted + lrr * dose, beverageMass: wanted, retained: lrr * dose, retainedRatio: lrr, brewRatio }
}
