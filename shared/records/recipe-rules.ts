import type { EntityData, EntityName } from '../schemas/entities'
import type { RecordLookup } from './rules'
import { RecipeSettingsSchema } from '../schemas/entities'

// How recipes, their versions, house marks and dial-in sessions hold together. Pure: the server
// runs these on every pushed change with a lookup into the team's records (the batch's view), so
// a recipe's fields are always those of a recorded version, and versions form one line.

const same = (a: unknown, b: unknown): boolean => JSON.stringify(a ?? null) === JSON.stringify(b ?? null)
const settingsKeys = Object.keys(RecipeSettingsSchema.shape) as (keyof EntityData<'recipeVersion'>['settings'])[]

/** A method with its article: "a percolation", "an espresso". */
const a = (word: string): string => `${/^[aeiou]/.test(word) ? 'an' : 'a'} ${word}`

/** A version in words for a refusal: "version 3 of “House filter”". */
const versionWords = (number: number, name: string): string => `version ${number} of “${name}”`

async function versionRefusal(data: EntityData<'recipeVersion'>, lookup: RecordLookup): Promise<string | null> {
  const recipe = await lookup('recipe', data.recipeId)
  const basedOn = data.basedOnId ? await lookup('recipeVersion', data.basedOnId) : undefined
  if (data.basedOnId && (!basedOn || basedOn.data.recipeId !== data.recipeId))
    return 'basedOnId: names no version of this recipe on the server.'
  const expected = (basedOn?.data.number ?? 0) + 1
  if (!recipe) {
    // A new recipe's first version arrives just before the recipe itself.
    return data.basedOnId || data.number !== 1 ? 'number: a new recipe starts at version 1.' : null
  }
  const current = recipe.data.versionId ? await lookup('recipeVersion', recipe.data.versionId) : undefined
  if ((data.basedOnId ?? null) !== (recipe.data.versionId ?? null)) {
    const latest = current ? versionWords(current.data.number, recipe.data.name) : `the first version of “${recipe.data.name}”`
    return `basedOnId: ${latest} was recorded since this change was started; open the recipe again and make the change on it.`
  }
  if (data.number !== expected)
    return `number: the version after ${basedOn ? `version ${basedOn.data.number}` : 'none'} is version ${expected}.`
  if (data.settings.method !== recipe.data.method)
    return `method: “${recipe.data.name}” stays ${a(recipe.data.method)} recipe; copy it to make one for another method.`
  return null
}

async function recipeRefusalOf(id: string, data: EntityData<'recipe'>, before: EntityData<'recipe'> | undefined, lookup: RecordLookup): Promise<string | null> {
  if (!data.versionId)
    return 'versionId: a recipe changes only through a new version, which keeps who, when and why.'
  const version = await lookup('recipeVersion', data.versionId)
  if (!version || version.data.recipeId !== id)
    return 'versionId: names no version of this recipe on the server.'
  if (before && before.versionId !== data.versionId && (version.data.basedOnId ?? null) !== (before.versionId ?? null))
    return `versionId: version ${version.data.number} does not follow the recipe's current version; open the recipe again and make the change on it.`
  const differs = settingsKeys.find(key => !same(data[key], version.data.settings[key]))
  return differs ? `${differs}: differs from version ${version.data.number}; a recipe's fields are those of its current version.` : null
}

/**
 * Why a recipe, a recipe version, a house mark, a dial-in session or a brew's recipe context does
 * not hold together with the records it names, or null when it does.
 * @param entity - the record's entity
 * @param id - the record's id
 * @param data - its data after the change
 * @param before - its data before the change (an edit), if any
 * @param lookup - the team's live records, as the server's batch sees them
 */
export async function recipeRefusal(entity: EntityName, id: string, data: EntityData<EntityName>, before: EntityData<EntityName> | undefined, lookup: RecordLookup): Promise<string | null> {
  // Each branch reads data of the entity it tests for: the data passed that entity's schema.
  if (entity === 'recipeVersion')
    return versionRefusal(data as EntityData<'recipeVersion'>, lookup)
  if (entity === 'recipe')
    return recipeRefusalOf(id, data as EntityData<'recipe'>, before as EntityData<'recipe'> | undefined, lookup)
  if (entity === 'houseRecipe' || entity === 'dialIn') {
    const { recipeId, method } = data as EntityData<'houseRecipe' | 'dialIn'>
    const recipe = recipeId ? await lookup('recipe', recipeId) : undefined
    if (recipe && recipe.data.method !== method)
      return `method: “${recipe.data.name}” is ${a(recipe.data.method)} recipe, not ${a(method)} one.`
    if (recipe?.data.retired)
      return `recipeId: “${recipe.data.name}” is retired; bring it back first.`
    return null
  }
  if (entity === 'brew') {
    const { context } = data as EntityData<'brew'>
    if (!context.versionId)
      return null
    const version = await lookup('recipeVersion', context.versionId)
    return context.kind !== 'recipe' || version?.data.recipeId !== context.refId ? 'context.versionId: names a version of another recipe.' : null
  }
  return null
}
