import type { Position, Range } from './zones'
import { BrewingInputError, requirePositive, requireTdsPercent } from './errors'
import { defaultRetainedRatio } from './extraction'
import { solveRecipe } from './recipe'
import { formatMass, formatTds, formatYield, roundHalfUp } from './rounding'

// What to change after a dial-in attempt, and by how much. Strength: the recipe solver, at the
// extraction the attempt reached. Extraction: a grind step read off the team's own brews of the
// same kind (least squares of extraction on the grind setting), when there are enough of them.

export type DialInMethod = 'percolation' | 'immersion' | 'espresso'

/** A measured brew, as the suggestion needs it. */
export interface AttemptFigures {
  method: DialInMethod
  /** Grams of coffee. */
  dose: number
  /** Grams of beverage the yield was computed with (weighed, or reckoned from the water). */
  beverageMass: number | null
  /** Grams of brew water, when the method uses it. */
  waterMass: number | null
  tdsPercent: number
  yieldPercent: number
  /** As typed on the grinder: "22 clicks", "2.4". */
  grindSetting: string
  waterTemperatureC: number | null
  /** LRR (g/g) the recipe counts on; null: the method's common-practice one. */
  retainedRatio?: number | null
}

/** What the attempt aims at: a target point, and the zone that counts as on target. */
export interface DialInTarget {
  tdsPercent: number
  yieldPercent: number
  zone: { tdsPercent: Range, yieldPercent: Range }
}

/** A grind step sized from the team's history. */
export interface GrindStep {
  from: number
  to: number
  /** What follows the number on the grinder ("clicks"), or ''. */
  unit: string
  /** Decimals the grinder's settings are written with (its resolution). */
  decimals: number
  /** Extraction points per unit of the setting (the fitted slope, %/unit). */
  slope: number
  /** Correlation of extraction with the setting over the brews used. */
  r: number
  brews: number
  /** The step goes past the settings the history covers. */
  beyondHistory: boolean
}

export interface ExtractionMove {
  position: Exclude<Position, 'in'>
  /** Extraction points to gain (+) or lose (−) to reach the target. */
  gapPoints: number
  grind: GrindStep | null
  /** Why no grind step could be sized, in words; null when one was. */
  noStep: string | null
}

export interface StrengthMove {
  position: Exclude<Position, 'in'>
  /** Grams of beverage that reach the target strength at the attempt's extraction, same dose. */
  beverageMass: number
  /** Grams of water to pour for it (percolation and immersion); null for espresso. */
  waterMass: number | null
  /** Grams of coffee that reach it with the same beverage (percolation, espresso) or water (immersion). */
  dose: number
}

export interface DialInSuggestion {
  extraction: ExtractionMove | null
  strength: StrengthMove | null
  /** What to change, in order, each with its size. */
  actions: string[]
  /** The reasoning, in one line. */
  reasoning: string
}

/** How many similar brews the grind step needs, and how closely they must agree (common practice for a rough fit). */
export const historyNeeded = { brews: 4, settings: 2, r: 0.6 } as const

/** A grinder setting's number and what follows it: "22 clicks" → 22, "clicks"; "2,4" → 2.4. Null without a number. */
export function readGrindSetting(text: string): { value: number, unit: string, decimals: number } | null {
  const trimmed = text.trim()
  const number = /^-?\d+(?:[.,]\d+)?/.exec(trimmed)?.[0]
  if (!number)
    return null
  return { value: Number(number.replace(',', '.')), unit: trimmed.slice(number.length).trim().toLowerCase(), decimals: number.split(/[.,]/)[1]?.length ?? 0 }
}

function place(value: number, range: Range, decimals: number): Position {
  const shown = roundHalfUp(value, decimals)
  return shown < range.min ? 'low' : shown > range.max ? 'high' : 'in'
}

/** Ordinary least squares of y on x: slope and correlation (null when x does not vary). */
function fitLine(points: { x: number, y: number }[]): { slope: number, r: number } | null {
  const n = points.length
  const mx = points.reduce((sum, p) => sum + p.x, 0) / n
  const my = points.reduce((sum, p) => sum + p.y, 0) / n
  const sxx = points.reduce((sum, p) => sum + (p.x - mx) ** 2, 0)
  const syy = points.reduce((sum, p) => sum + (p.y - my) ** 2, 0)
  const sxy = points.reduce((sum, p) => sum + (p.x - mx) * (p.y - my), 0)
  if (sxx === 0)
    return null
  return { slope: sxy / sxx, r: syy === 0 ? 0 : sxy / Math.sqrt(sxx * syy) }
}

/**
 * Brews like the attempt: the same method, a grinder setting in the same unit, a dose and a brew
 * ratio within 20 % of the attempt's, and a water temperature within 3 °C when both are known.
 */
export function similarBrews(attempt: AttemptFigures, history: readonly AttemptFigures[]): AttemptFigures[] {
  const grind = readGrindSetting(attempt.grindSetting)
  const ratio = attempt.yieldPercent / attempt.tdsPercent
  const near = (a: number, b: number, share: number): boolean => Math.abs(a - b) <= share * Math.abs(b)
  return history.filter((brew) => {
    const setting = readGrindSetting(brew.grindSetting)
    return brew.method === attempt.method && setting !== null && grind !== null && setting.unit === grind.unit
      && near(brew.dose, attempt.dose, 0.2) && near(brew.yieldPercent / brew.tdsPercent, ratio, 0.2)
      && (brew.waterTemperatureC === null || attempt.waterTemperatureC === null || Math.abs(brew.waterTemperatureC - attempt.waterTemperatureC) <= 3)
  })
}

function grindStep(attempt: AttemptFigures, history: readonly AttemptFigures[], gap: number, whose: string): { step: GrindStep | null, noStep: string | null } {
  const grind = readGrindSetting(attempt.grindSetting)
  if (!grind)
    return { step: null, noStep: 'the grind setting has no number to step from' }
  const similar = similarBrews(attempt, history)
  const points = similar.map(brew => ({ x: readGrindSetting(brew.grindSetting)!.value, y: brew.yieldPercent }))
  const settings = new Set(points.map(p => p.x)).size
  if (similar.length < historyNeeded.brews || settings < historyNeeded.settings)
    return { step: null, noStep: `${whose} ${similar.length} similar ${attempt.method} brews at ${settings} grind settings are short of the ${historyNeeded.brews} at ${historyNeeded.settings} or more a grind step needs` }
  const fit = fitLine(points)
  if (!fit || fit.slope === 0 || Math.abs(fit.r) < historyNeeded.r)
    return { step: null, noStep: `${whose} ${similar.length} similar brews show no clear link between grind and extraction (r = ${(fit?.r ?? 0).toFixed(2)})` }
  // The step at the grinder's own resolution (as its settings are written), at least one notch.
  const decimals = Math.max(grind.decimals, ...similar.map(brew => readGrindSetting(brew.grindSetting)!.decimals))
  const unit = 10 ** -decimals
  const raw = gap / fit.slope
  const steps = Math.max(1, Math.abs(roundHalfUp(raw / unit, 0))) * Math.sign(raw)
  const to = roundHalfUp(grind.value + steps * unit, decimals)
  const low = Math.min(...points.map(p => p.x))
  const high = Math.max(...points.map(p => p.x))
  return { step: { from: grind.value, to, unit: grind.unit, decimals, slope: fit.slope, r: fit.r, brews: similar.length, beyondHistory: to < low || to > high }, noStep: null }
}

/** The masses that reach the target strength at the attempt's own extraction (the recipe solver). */
function strengthMove(attempt: AttemptFigures, targetTds: number, position: Exclude<Position, 'in'>): StrengthMove {
  const lrr = attempt.retainedRatio ?? defaultRetainedRatio[attempt.method === 'immersion' ? 'immersion' : 'percolation']
  const base = { targetTdsPercent: targetTds, targetYieldPercent: attempt.yieldPercent, method: attempt.method, retainedRatio: lrr }
  const sameDose = solveRecipe({ ...base, dose: attempt.dose })
  let dose: number
  if (attempt.method === 'immersion' && attempt.waterMass !== null)
    dose = attempt.dose * attempt.waterMass / sameDose.waterMass
  else
    dose = solveRecipe({ ...base, beverageMass: attempt.beverageMass ?? sameDose.beverageMass }).dose
  return { position, beverageMass: sameDose.beverageMass, waterMass: attempt.method === 'espresso' ? null : sameDose.waterMass, dose }
}

const g = (mass: number): string => `${formatMass(mass)} g`
const settingText = (value: number, step: GrindStep): string => `${value.toFixed(step.decimals)}${step.unit ? ` ${step.unit}` : ''}`

/**
 * What to change after a dial-in attempt, with a size. Extraction comes first (it moves strength
 * too): its direction, and a grind step from the team's similar brews when there are enough of
 * them. Strength: the beverage, water or dose that reaches the target strength at the extraction
 * the attempt reached, from the recipe solver. An axis inside the zone is left alone.
 * @param attempt - the attempt measured
 * @param target - the recipe's target point and zone
 * @param history - the team's measured brews (the attempt among them or not)
 * @param historyWords - whose brews they are, for the reasoning: "the team's", "this session's"
 * @throws BrewingInputError for figures it cannot use, or a strength the grounds make impossible (immersion)
 */
export function suggestNextChange(attempt: AttemptFigures, target: DialInTarget, history: readonly AttemptFigures[], historyWords = 'the team\'s'): DialInSuggestion {
  requireTdsPercent(attempt.tdsPercent)
  requirePositive(attempt.yieldPercent, 'yieldPercent', 'The extraction yield')
  requirePositive(attempt.dose, 'dose', 'The dose')
  requireTdsPercent(target.tdsPercent, 'target.tdsPercent')
  if (!(target.yieldPercent > 0 && target.yieldPercent < 100))
    throw new BrewingInputError('target.yieldPercent', 'The target extraction yield must be between 0 and 100 %.')
  const eyPosition = place(attempt.yieldPercent, target.zone.yieldPercent, 1)
  const tdsPosition = place(attempt.tdsPercent, target.zone.tdsPercent, 2)
  const gap = target.yieldPercent - attempt.yieldPercent
  const landed = `Landed at ${formatTds(attempt.tdsPercent)} %TDS and ${formatYield(attempt.yieldPercent)} % EY against a target of ${formatTds(target.tdsPercent)} %TDS and ${formatYield(target.yieldPercent)} %`
  const actions: string[] = []
  const reasons: string[] = [landed]

  let extraction: ExtractionMove | null = null
  if (eyPosition !== 'in') {
    const { step, noStep } = grindStep(attempt, history, gap, historyWords)
    extraction = { position: eyPosition, gapPoints: gap, grind: step, noStep }
    const size = `${formatYield(Math.abs(gap))} points`
    if (step) {
      actions.push(`${gap > 0 ? 'Raise' : 'Lower'} the extraction ${size}: grind ${gap > 0 ? 'finer' : 'coarser'}, from ${settingText(step.from, step)} to ${settingText(step.to, step)}${step.beyondHistory ? ' (past the settings the team has brewed at: go one step and measure)' : ''}.`)
      reasons.push(`${historyWords} ${step.brews} similar brews move ${formatYield(Math.abs(step.slope))} points per ${step.unit ? step.unit.replace(/s$/, '') : 'unit'} (r = ${step.r.toFixed(2)})`)
    }
    else {
      actions.push(`${gap > 0 ? 'Raise the extraction' : 'Lower the extraction'} ${size}: ${gap > 0 ? 'grind finer, lengthen the contact time, or brew a little hotter' : 'grind coarser, shorten the contact time, or brew a little cooler'}; one step at a time.`)
      reasons.push(`no grind step sized: ${noStep}`)
    }
  }

  let strength: StrengthMove | null = null
  if (tdsPosition !== 'in') {
    strength = strengthMove(attempt, target.tdsPercent, tdsPosition)
    const at = `at ${formatYield(attempt.yieldPercent)} % EY`
    if (attempt.method === 'espresso')
      actions.push(`For ${formatTds(target.tdsPercent)} %TDS ${at}: stop the shot at ${g(strength.beverageMass)} from ${g(attempt.dose)}, or dose ${g(strength.dose)} for ${g(attempt.beverageMass ?? strength.beverageMass)}.`)
    else if (attempt.method === 'immersion')
      actions.push(`For ${formatTds(target.tdsPercent)} %TDS ${at}: brew ${g(attempt.dose)} in ${g(strength.waterMass!)} of water, or dose ${g(strength.dose)} in the same water.`)
    else
      actions.push(`For ${formatTds(target.tdsPercent)} %TDS ${at}: pour ${g(strength.waterMass!)} of water on ${g(attempt.dose)} (${g(strength.beverageMass)} of beverage), or dose ${g(strength.dose)} for the same beverage.`)
    reasons.push(`the recipe solver puts ${formatTds(target.tdsPercent)} %TDS ${at} at ${g(strength.beverageMass)} of beverage per ${g(attempt.dose)}`)
    if (extraction)
      reasons.push('change the extraction first: it moves the strength too')
  }
  if (!actions.length)
    actions.push('Keep it: strength and extraction are both inside the target zone.')
  return { extraction, strength, actions, reasoning: `${reasons.join('; ')}.` }
}
