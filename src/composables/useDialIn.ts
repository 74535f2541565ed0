import type { Ref } from 'vue'
import type { AttemptFigures, BrewResult, DialInSuggestion, DialInTarget, ZoneVerdict } from '../../shared/brewing'
import type { BrewContext } from '../../shared/schemas/entities'
import type { LocalRecord } from '../db/database'
import type { JudgedZone } from './brewContexts'
import { computed } from 'vue'
import { BrewingInputError, computeBrew, formatTds, formatYield, suggestNextChange, zoneVerdict } from '../../shared/brewing'
import { brewInputOf } from '../../shared/records/brew-input'
import { db } from '../db/database'
import { brewsNewestFirst } from '../db/queries'
import { useBrewContexts } from './useBrewContexts'
import { useLiveQuery } from './useLiveQuery'

type Brew = LocalRecord<'brew'>

/** One attempt of a session: its brew, its number (in the order brewed), its figures and verdict. */
export interface Attempt {
  number: number
  brew: Brew
  /** Net masses as the core computes them from the record. */
  masses: Pick<BrewResult, 'dose' | 'beverageMass' | 'beverageEstimated' | 'retainedRatio'>
  tdsPercent: number | null
  yieldPercent: number | null
  judged: JudgedZone
  verdict: ZoneVerdict | null
}

/** A measured brew as the dial-in suggestion reads it; null until it has a result and a dose. */
export function figuresOf(brew: Brew): AttemptFigures | null {
  const tdsPercent = brew.derived?.tdsPercent ?? null
  const yieldPercent = brew.derived?.yieldPercent ?? null
  const { dose, beverageMass, retainedRatio } = computeBrew(brewInputOf(brew, [], null))
  if (tdsPercent === null || yieldPercent === null || dose === null || tdsPercent <= 0 || yieldPercent <= 0)
    return null
  return { method: brew.method, dose, beverageMass, waterMass: brew.waterMass, tdsPercent, yieldPercent, grindSetting: brew.grindSetting, waterTemperatureC: brew.waterTemperatureC, retainedRatio }
}

/** The team's latest brews that size a suggested change, however many the phone holds. */
const historyLimit = 1000

/** The session's attempts (by the index of the session they name) and the team's latest brews, each once. */
async function sessionAndRecent(teamId: string, sessionId: string): Promise<Brew[]> {
  const [attempts, recent] = await Promise.all([
    db.brews.where('context.sessionId').equals(sessionId).filter(brew => !brew.deletedAt && brew.teamId === teamId).toArray(),
    brewsNewestFirst(teamId, historyLimit),
  ])
  const seen = new Set(attempts.map(brew => brew.id))
  return [...attempts, ...recent.filter(brew => !seen.has(brew.id))]
}

/**
 * A dial-in session from the phone's store: its recipe and the version it stands at, the target
 * its attempts aim at, the attempts in the order brewed, and what to change after any of them
 * (from the team's own brews).
 */
export function useDialIn(sessionId: Ref<string>, teamId: Ref<string | null>) {
  const contexts = useBrewContexts(teamId)
  const { value: rows, state } = useLiveQuery(async () => ({
    session: await db.dialIns.get(sessionId.value),
    brews: teamId.value ? await sessionAndRecent(teamId.value, sessionId.value) : [],
  }), { session: undefined as LocalRecord<'dialIn'> | undefined, brews: [] as Brew[] }, computed(() => [sessionId.value, teamId.value]))

  const session = computed(() => (rows.value.session && !rows.value.session.deletedAt ? rows.value.session : undefined))
  const recipe = computed(() => (session.value?.recipeId ? contexts.found.value.recipes.get(session.value.recipeId) : undefined))
  const version = computed(() => (recipe.value?.versionId ? contexts.found.value.recipeVersions.get(recipe.value.versionId) : undefined))
  /** The context the next attempt is measured for: the recipe's current version, or the blank session. */
  const nextContext = computed<BrewContext>(() => (recipe.value
    ? { kind: 'recipe', refId: recipe.value.id, versionId: recipe.value.versionId, sessionId: sessionId.value }
    : { kind: 'quick', refId: null, sessionId: sessionId.value }))
  const judged = computed(() => contexts.zoneOf(nextContext.value, session.value?.method ?? 'percolation'))
  /** The recipe's target point (else the zone's middle) and its zone. */
  const target = computed<DialInTarget>(() => {
    const { zone } = judged.value
    const middle = (range: { min: number, max: number }): number => (range.min + range.max) / 2
    return { tdsPercent: recipe.value?.targetTdsPercent ?? middle(zone.tdsPercent), yieldPercent: recipe.value?.targetYieldPercent ?? middle(zone.yieldPercent), zone }
  })

  /** The target in words: "1.30 %TDS at 20.5 % EY", and where it comes from. */
  const targetWords = computed(() => {
    const own = recipe.value?.targetTdsPercent != null && recipe.value.targetYieldPercent != null
    return `${formatTds(target.value.tdsPercent)} %TDS at ${formatYield(target.value.yieldPercent)} % EY${own ? '' : ' (the middle of the zone where the recipe names none)'}`
  })

  const attempts = computed<Attempt[]>(() => rows.value.brews
    .filter(brew => brew.context.sessionId === sessionId.value)
    .sort((a, b) => a.brewedAt.localeCompare(b.brewedAt) || a.createdAt.localeCompare(b.createdAt))
    .map((brew, index) => {
      const tdsPercent = brew.derived?.tdsPercent ?? null
      const yieldPercent = brew.derived?.yieldPercent ?? null
      const judgedZone = contexts.zoneOf(brew.context, brew.method)
      const verdict = tdsPercent !== null && yieldPercent !== null && tdsPercent > 0 && yieldPercent > 0 ? zoneVerdict(judgedZone.zone, { tdsPercent, yieldPercent }) : null
      return { number: index + 1, brew, masses: computeBrew(brewInputOf(brew, [], null)), tdsPercent, yieldPercent, judged: judgedZone, verdict }
    }))
  const history = computed(() => rows.value.brews.flatMap(brew => figuresOf(brew) ?? []))
  const own = computed(() => attempts.value.flatMap(attempt => figuresOf(attempt.brew) ?? []))

  /** What to change after an attempt, with its size; null when it has no result (or one the core refuses). */
  function suggestionFor(attempt: Attempt): DialInSuggestion | null {
    const figures = figuresOf(attempt.brew)
    if (!figures)
      return null
    try {
      // The session's own attempts share its grinder and water: they size the step when they can.
      const mine = suggestNextChange(figures, target.value, own.value, 'this session\'s')
      return mine.extraction && !mine.extraction.grind ? suggestNextChange(figures, target.value, history.value) : mine
    }
    catch (error) {
      if (error instanceof BrewingInputError)
        return null
      throw error
    }
  }

  return { state, session, recipe, version, nextContext, judged, target, targetWords, attempts, suggestionFor, contexts }
}
