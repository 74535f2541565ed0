import { BrewingInputError, requireFinite, requireNonNegative } from './errors'
import { roundHalfUp } from './rounding'

/** One attribute of a score sheet, with its own scale where it differs from the sheet's. */
export interface ScoreAttribute {
  key: string
  label: string
  scaleMin?: number | null
  scaleMax?: number | null
  step?: number | null
}

/** What a score sheet needs for the sums: its attributes, its scale and how the total is formed. */
export interface ScoreSheet {
  id: string
  name: string
  attributes: readonly ScoreAttribute[]
  scaleMin: number
  scaleMax: number
  step: number
  total: 'sum' | 'mean'
}

/**
 * The trade's usual cupping attributes, scored 6–10 in quarter points and summed, with uniformity,
 * clean cup and sweetness counted per cup (10 points, 2 off for each cup that falls short). The
 * attribute set and scales follow the SCA cupping form (from memory); the wording is ours where the
 * form's is not a trade term. A team sheet replaces it where a team wants its own.
 */
export const defaultScoreSheet: ScoreSheet = {
  id: 'trade-attributes',
  name: 'Trade cupping attributes',
  attributes: [
    { key: 'fragrance-aroma', label: 'Fragrance and aroma' },
    { key: 'flavour', label: 'Flavour' },
    { key: 'aftertaste', label: 'Aftertaste' },
    { key: 'acidity', label: 'Acidity' },
    { key: 'body', label: 'Body' },
    { key: 'balance', label: 'Balance' },
    { key: 'uniformity', label: 'Uniformity', scaleMin: 0, scaleMax: 10, step: 2 },
    { key: 'clean-cup', label: 'Clean cup', scaleMin: 0, scaleMax: 10, step: 2 },
    { key: 'sweetness', label: 'Sweetness', scaleMin: 0, scaleMax: 10, step: 2 },
    { key: 'overall', label: 'Overall' },
  ],
  scaleMin: 6,
  scaleMax: 10,
  step: 0.25,
  total: 'sum',
}

/** An attribute's scale: its own, else the sheet's. */
export function scaleOf(sheet: ScoreSheet, attribute: ScoreAttribute): { min: number, max: number, step: number } {
  return { min: attribute.scaleMin ?? sheet.scaleMin, max: attribute.scaleMax ?? sheet.scaleMax, step: attribute.step ?? sheet.step }
}

/**
 * Checks one score against its attribute's scale: inside it and on its step (8.25 on a 0.25 step,
 * not 8.3). Throws BrewingInputError naming `values.<key>`.
 */
export function checkScore(sheet: ScoreSheet, attribute: ScoreAttribute, value: number): number {
  const field = `values.${attribute.key}`
  requireFinite(value, field, attribute.label)
  const { min, max, step } = scaleOf(sheet, attribute)
  if (value < min || value > max)
    throw new BrewingInputError(field, `${attribute.label} is scored from ${min} to ${max}.`)
  const steps = (value - min) / step
  if (Math.abs(steps - Math.round(steps)) > 1e-9)
    throw new BrewingInputError(field, `${attribute.label} is scored in steps of ${step}.`)
  return value
}

export interface ScoreTotal {
  /** The total less the deduction; null until every attribute is scored. */
  total: number | null
  /** Attributes not scored yet, by key. */
  missing: string[]
}

/**
 * A taster's total for one lot: the sum (or mean) of every attribute on the sheet, less the points
 * taken off for defective cups. Scores of attributes no longer on the sheet are left out.
 * @param sheet - the table's score sheet
 * @param values - the taster's score per attribute key
 * @param deduction - points taken off the total (defects), ≥ 0
 */
export function scoreTotal(sheet: ScoreSheet, values: readonly { attribute: string, value: number }[], deduction = 0): ScoreTotal {
  requireNonNegative(deduction, 'deduction', 'The points taken off')
  const byKey = new Map(values.map(entry => [entry.attribute, entry.value]))
  const missing: string[] = []
  let sum = 0
  for (const attribute of sheet.attributes) {
    const value = byKey.get(attribute.key)
    if (value === undefined) {
      missing.push(attribute.key)
      continue
    }
    sum += checkScore(sheet, attribute, value)
  }
  if (missing.length)
    return { total: null, missing }
  const total = (sheet.total === 'mean' ? sum / sheet.attributes.length : sum) - deduction
  // Quarter points summed in binary floating point: rounded back to the digits a person adds up.
  return { total: roundHalfUp(total, 6), missing }
}

export interface LotScores {
  /** Tasters whose score is complete. */
  tasters: number
  /** The table's mean total for the lot; null until one taster's score is complete. */
  meanTotal: number | null
  /** Mean per attribute key, over the tasters who scored it. */
  attributeMeans: Map<string, number>
}

/** The table's mean per lot over its tasters' complete totals, and per attribute. */
export function lotScores(sheet: ScoreSheet, scores: readonly { values: readonly { attribute: string, value: number }[], deduction: number }[]): LotScores {
  const totals = scores.flatMap(score => scoreTotal(sheet, score.values, score.deduction).total ?? [])
  const attributeMeans = new Map<string, number>()
  for (const attribute of sheet.attributes) {
    const given = scores.flatMap(score => score.values.filter(v => v.attribute === attribute.key).map(v => v.value))
    if (given.length)
      attributeMeans.set(attribute.key, given.reduce((sum, v) => sum + v, 0) / given.length)
  }
  return { tasters: totals.length, meanTotal: totals.length ? totals.reduce((sum, v) => sum + v, 0) / totals.length : null, attributeMeans }
}
