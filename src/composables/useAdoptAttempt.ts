import type { LocalRecord } from '../db/database'
import type { Attempt } from './useDialIn'
import { mayChange, mayCreate } from '../../shared/records/rules'
import { db } from '../db/database'
import { presentAlert } from '../overlays/alert'
import { presentToast } from '../overlays/toast'
import { useSessionStore } from '../stores/session'
import { useSyncStore } from '../stores/sync'
import { adoptAttempt } from '../sync/recipes'

/**
 * Adopting a dial-in attempt: asks why (and, for a blank start, the new recipe's name), then saves
 * the recipe's next version on the phone. Offered only to whoever may change the recipe.
 */
export function useAdoptAttempt() {
  const session = useSessionStore()
  const sync = useSyncStore()

  function mayAdopt(recipe: LocalRecord<'recipe'> | undefined): boolean {
    return Boolean(session.activeTeamId) && (recipe ? mayChange(session.actor, 'recipe', recipe.createdBy) : mayCreate(session.actor, 'recipe'))
  }

  async function adopt(dialIn: LocalRecord<'dialIn'>, attempt: Attempt, recipe: LocalRecord<'recipe'> | undefined): Promise<void> {
    // Alert fields have no visible label: each placeholder says what it is and what a blank gives.
    const defaults = { name: `${dialIn.place} ${dialIn.method}`, reason: `Attempt ${attempt.number} of the dial-in at ${dialIn.place}` }
    const inputs = [
      ...(recipe ? [] : [{ name: 'name', type: 'text' as const, placeholder: `Recipe name (blank: ${defaults.name})`, attributes: { 'aria-label': 'Recipe name', 'maxlength': 120 } }]),
      { name: 'reason', type: 'text' as const, placeholder: `Why (blank: ${defaults.reason})`, attributes: { 'aria-label': 'Why', 'maxlength': 300 } },
    ]
    await presentAlert({
      header: recipe ? `Adopt attempt ${attempt.number} into “${recipe.name}”?` : `Make attempt ${attempt.number} a recipe?`,
      message: 'Its dose, beverage, water, grind, time and temperature become the next version; the reason stays with it.',
      inputs,
      buttons: [
        { text: 'Cancel', role: 'cancel' },
        { text: 'Adopt', handler: (values: { name?: string, reason?: string }) => {
          const reason = values.reason?.trim() || defaults.reason
          const name = values.name?.trim() || defaults.name
          void adoptAttempt(db, { teamId: dialIn.teamId, userId: session.user!.id, session: dialIn, brew: attempt.brew, masses: attempt.masses, recipe, name, reason })
            .then(async ({ versionId }) => {
              const version = await db.recipeVersions.get(versionId)
              await presentToast({ message: `Attempt ${attempt.number} is now version ${version?.number ?? 1} of “${version?.settings.name ?? ''}”.`, duration: 3000, position: 'top' })
              void sync.syncNow()
            })
        } },
      ],
    })
  }

  return { mayAdopt, adopt }
}
