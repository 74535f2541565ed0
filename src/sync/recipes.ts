import type { BrewResult } from '../../shared/brewing'
import type { RecipeSettings } from '../../shared/schemas/entities'
import type { LixiviaDatabase, LocalRecord } from '../db/database'
import { v7 as uuidv7 } from 'uuid'
import { settingsFromAttempt, settingsOf } from '../forms/recipeForm'
import { saveRecord } from './outbox'

/** Who saves, for which team. */
export interface Saver { teamId: string, userId: string }

export interface VersionSave extends Saver {
  /** The recipe it changes; a new recipe otherwise. */
  recipeId?: string
  settings: RecipeSettings
  /** Why: it stays with the version. */
  reason: string
  /** The dial-in attempt whose numbers these are, when one was adopted. */
  fromBrewId?: string | null
}

/**
 * A recipe's next version and the recipe itself, pointing at it, saved together on the phone and
 * queued in that order (the server takes a recipe only with the version it names). A new recipe
 * starts at version 1; a change follows the recipe's current version.
 * @returns the recipe's and the new version's ids
 */
export async function saveRecipeVersion(database: LixiviaDatabase, save: VersionSave): Promise<{ recipeId: string, versionId: string }> {
  const { teamId, userId } = save
  return database.transaction('rw', database.recipes, database.recipeVersions, database.outbox, async () => {
    const recipe = save.recipeId ? await database.recipes.get(save.recipeId) : undefined
    const current = recipe?.versionId ? await database.recipeVersions.get(recipe.versionId) : undefined
    // A recipe id is made here for a new recipe, so its first version can name it.
    const recipeId = recipe?.id ?? uuidv7()
    const versionId = await saveRecord(database, 'recipeVersion', {
      teamId,
      userId,
      data: { recipeId, number: (current?.number ?? 0) + 1, basedOnId: current?.id ?? null, reason: save.reason.trim(), settings: save.settings, fromBrewId: save.fromBrewId ?? null },
    })
    // The recipe's change goes behind its version (a queued create of it stays where it is, ahead
    // of the brews that name it).
    await saveRecord(database, 'recipe', { teamId, userId, id: recipeId, data: { ...save.settings, versionId }, ownMutation: true })
    return { recipeId, versionId }
  })
}

/** Marks a recipe as the crew's house recipe for its method (a lead or an owner); null clears the mark. */
export async function markHouseRecipe(database: LixiviaDatabase, saver: Saver, method: RecipeSettings['method'], recipeId: string | null): Promise<void> {
  await saveRecord(database, 'houseRecipe', { ...saver, data: { method, recipeId } })
}

export interface Adoption extends Saver {
  session: LocalRecord<'dialIn'>
  brew: LocalRecord<'brew'>
  /** The attempt's net masses as the core computed them. */
  masses: Pick<BrewResult, 'dose' | 'beverageMass' | 'retainedRatio'>
  /** The session's recipe; none for a blank start, which makes a new recipe of this name. */
  recipe?: LocalRecord<'recipe'>
  name?: string
  reason: string
}

/**
 * One action turns a dial-in attempt into the recipe's next version: its dose, beverage, water,
 * grind, time and temperature, with the reason and the attempt it came from. A blank start makes a
 * new recipe of it (version 1), and the session follows that recipe from then on.
 * @returns the recipe's and the version's ids
 */
export async function adoptAttempt(database: LixiviaDatabase, adoption: Adoption): Promise<{ recipeId: string, versionId: string }> {
  const { session, brew, recipe, teamId, userId } = adoption
  const base: RecipeSettings = recipe
    ? settingsOf(recipe)
    : { name: adoption.name?.trim() || `Dial-in at ${session.place}`, method: session.method, dose: adoption.masses.dose ?? 1, waterMass: null, beverageMass: null, targetTdsPercent: null, targetYieldPercent: null, grindSetting: '', contactTimeSeconds: null, waterTemperatureC: null, notes: '', retainedRatio: null, timeToleranceSeconds: null, zoneId: session.zoneId, retired: false }
  return database.transaction('rw', database.recipes, database.recipeVersions, database.dialIns, database.outbox, async () => {
    const saved = await saveRecipeVersion(database, { teamId, userId, recipeId: recipe?.id, settings: settingsFromAttempt(brew, adoption.masses, base), reason: adoption.reason, fromBrewId: brew.id })
    // Behind the new recipe, and behind the attempts that name the session as it was.
    if (!recipe)
      await saveRecord(database, 'dialIn', { teamId, userId, id: session.id, data: { recipeId: saved.recipeId }, ownMutation: true })
    return saved
  })
}
