import type { BrewMethod } from '../../shared/brewing'
import type { LocalRecord } from '../db/database'

// The crew's recipes as every screen orders them: the house recipe of each method first (the
// latest mark a lead made, the same on every phone once synced), then the others by name, the
// retired ones last. No Vue here: the Bench's picker and the recipe screens share it.

export const methodOrder: readonly BrewMethod[] = ['percolation', 'immersion', 'espresso']

/** Marks in the order they stand: by the server's rev, those not yet sent last, in the order made. */
export function marksInOrder(marks: readonly LocalRecord<'houseRecipe'>[]): LocalRecord<'houseRecipe'>[] {
  return [...marks].filter(mark => !mark.deletedAt).sort((a, b) => (a.rev ?? Infinity) - (b.rev ?? Infinity) || a.createdAt.localeCompare(b.createdAt))
}

/**
 * The house recipe of each method: the latest mark's, if that recipe is on the phone, live, not
 * retired and of the method (a retired house recipe leaves its method without one).
 */
export function houseRecipes(marks: readonly LocalRecord<'houseRecipe'>[], recipes: readonly LocalRecord<'recipe'>[]): Map<BrewMethod, LocalRecord<'recipe'>> {
  const byId = new Map(recipes.map(recipe => [recipe.id, recipe]))
  const latest = new Map<BrewMethod, string | null>()
  for (const mark of marksInOrder(marks))
    latest.set(mark.method, mark.recipeId)
  const house = new Map<BrewMethod, LocalRecord<'recipe'>>()
  for (const [method, id] of latest) {
    const recipe = id ? byId.get(id) : undefined
    if (recipe && !recipe.deletedAt && !recipe.retired && recipe.method === method)
      house.set(method, recipe)
  }
  return house
}

/** Recipes in the order the screens list them: house recipes by method, then by name, retired last. */
export function recipesInOrder(recipes: readonly LocalRecord<'recipe'>[], house: ReadonlyMap<BrewMethod, LocalRecord<'recipe'>>): LocalRecord<'recipe'>[] {
  const houseIds = new Map([...house].map(([method, recipe]) => [recipe.id, methodOrder.indexOf(method)]))
  const rank = (recipe: LocalRecord<'recipe'>): number => houseIds.get(recipe.id) ?? (recipe.retired ? 20 : 10)
  return recipes.filter(recipe => !recipe.deletedAt).sort((a, b) => rank(a) - rank(b) || a.name.localeCompare(b.name))
}
