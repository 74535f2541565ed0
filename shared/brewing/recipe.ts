import type { BrewMethod } from './uncertainty'
import { BrewingInputError, requireNonNegative, requirePositive, requireTdsPercent } from './errors'
import { defaultRetainedRatio } from './extraction'

export interface RecipeInput {
  targetTdsPercent: number
  targetYieldPercent: number
  method: BrewMethod
  /** Grams of coffee to use; give this or `beverageMass`. */
  dose?: number
  /** Grams of beverage wanted; give this or `dose`. */
  beverageMass?: number
  /** LRR, grams of liquid the grounds keep per gram (defaults: 2.0 percolation, 3.0 immersion). */
  retainedRatio?: number
}

export interface Recipe {
  method: BrewMethod
  dose: number
  /** Grams of beverage: weighed for percolation and espresso, what can be poured off for immersion. */
  beverageMass: number
  /** Grams of water to brew with. */
  waterMass: number
  /** Brew ratio: grams of beverage per gram of coffee (ratio.ts), EY / TDS of the target. */
  brewRatio: number
  retainedRatio: number
}

/**
 * The recipe that lands on a target strength and extraction. Percolation and espresso:
 * beverage = EY × dose / TDS, water = beverage + LRR × dose. Full immersion: water from
 * EY = W × TDS / ((1 − TDS) × dose), beverage = water − LRR × dose. Feeding the result back into
 * `percolationYield` or `immersionYield` returns the target.
 */
export function solveRecipe(input: RecipeInput): Recipe {
  const tds = requireTdsPercent(input.targetTdsPercent, 'targetTdsPercent')
  const ey = requirePositive(input.targetYieldPercent, 'targetYieldPercent', 'The target extraction yield')
  if (ey >= 100)
    throw new BrewingInputError('targetYieldPercent', 'The target extraction yield must be below 100 %.')
  if (input.method !== 'percolation' && input.method !== 'espresso' && input.method !== 'immersion')
    throw new BrewingInputError('method', 'The method must be percolation, espresso or immersion.')
  if ((input.dose === undefined) === (input.beverageMass === undefined))
    throw new BrewingInputError('dose', 'Give either the dose or the beverage mass wanted, not both.')
  const retainedRatio = requireNonNegative(
    input.retainedRatio ?? defaultRetainedRatio[input.method === 'immersion' ? 'immersion' : 'percolation'],
    'retainedRatio',
    'The retained liquid ratio (LRR)',
  )
  const t = tds / 100

  if (input.method === 'immersion') {
    // Water per gram of coffee that dissolves EY % of it at this strength.
    const waterPerDose = ((ey / 100) * (1 - t)) / t
    if (waterPerDose <= retainedRatio)
      throw new BrewingInputError('targetTdsPercent', 'At this strength the grounds would hold all the water; aim for a weaker brew.')
    const dose = input.dose !== undefined
      ? requirePositive(input.dose, 'dose', 'The dose')
      : requirePositive(input.beverageMass as number, 'beverageMass', 'The beverage mass') / (waterPerDose - retainedRatio)
    const waterMass = waterPerDose * dose
    return { method: input.method, dose, beverageMass: waterMass - retainedRatio * dose, waterMass, brewRatio: ey / tds, retainedRatio }
  }

  const beveragePerDose = ey / tds
  const dose = input.dose !== undefined
    ? requirePositive(input.dose, 'dose', 'The dose')
    : requirePositive(input.beverageMass as number, 'beverageMass', 'The beverage mass') / beveragePerDose
  const beverageMass = beveragePerDose * dose
  const waterMass = beverageMass + retainedRatio * dose
  return { method: input.method, dose, beverageMass, waterMass, brewRatio: ey / tds, retainedRatio }
}
