import type { Ref } from 'vue'
import type { BrewMethod } from '../../shared/brewing'
import type { LocalRecord } from '../db/database'
import { computed } from 'vue'
import { db } from '../db/database'
import { houseRecipes, recipesInOrder } from './recipeBook'
import { useLiveQuery } from './useLiveQuery'

const none = { recipes: [] as LocalRecord<'recipe'>[], versions: [] as LocalRecord<'recipeVersion'>[], marks: [] as LocalRecord<'houseRecipe'>[] }

/** The team's recipes with their versions and the crew's house marks, from the phone's store. */
export function useRecipes(teamId: Ref<string | null>) {
  const { value: rows, state } = useLiveQuery(async () => {
    if (!teamId.value)
      return none
    const team = teamId.value
    const [recipes, versions, marks] = await Promise.all([
      db.recipes.where('teamId').equals(team).toArray(),
      db.recipeVersions.where('teamId').equals(team).toArray(),
      db.houseRecipes.where('teamId').equals(team).toArray(),
    ])
    return { recipes, versions, marks }
  }, none, teamId)

  const house = computed(() => houseRecipes(rows.value.marks, rows.value.recipes))
  const houseIds = computed(() => new Map([...house.value].map(([method, recipe]) => [recipe.id, method])))
  const recipes = computed(() => recipesInOrder(rows.value.recipes, house.value))
  const versions = computed(() => new Map(rows.value.versions.map(version => [version.id, version])))

  return {
    state,
    recipes,
    house,
    /** The method a recipe is the house recipe of, if any. */
    houseMethodOf: (recipeId: string): BrewMethod | undefined => houseIds.value.get(recipeId),
    version: (id: string | null | undefined): LocalRecord<'recipeVersion'> | undefined => (id ? versions.value.get(id) : undefined),
    /** A recipe's versions, newest first. */
    versionsOf: (recipeId: string): LocalRecord<'recipeVersion'>[] => rows.value.versions.filter(version => version.recipeId === recipeId).sort((a, b) => b.number - a.number || b.createdAt.localeCompare(a.createdAt)),
  }
}
