import { BrewingInputError, requireTdsPercent } from './errors'
import { cuppingRatio } from './ratio'
import { summarizeReadings } from './readings'

/** One cupping bowl's results: strength, and extraction yield when it is known. */
export interface BowlResult {
  tdsPercent: number
  yieldPercent: number | null
}

export interface BowlsSummary {
  n: number
  /** Mean strength of every bowl, %TDS. */
  meanTdsPercent: number
  /** Mean extraction of the bowls whose yield is known, %; null when none is. */
  meanYieldPercent: number | null
  /** Bowl-to-bowl spread: sample standard deviation (n − 1) and range of the strengths, %TDS. */
  sdTdsPercent: number
  rangeTdsPercent: number
  /**
   * The bowl that sits far from the others (index into the bowls given), its gap to the nearest
   * other bowl, and the mean of the others; null when the bowls agree or are too few to tell.
   */
  outlier: { index: number, tdsPercent: number, gapTdsPercent: number, meanOthersTdsPercent: number } | null
  /** Whether the bowls agree; null with fewer than three bowls (no bowl can stand apart from one other). */
  uniform: boolean | null
}

/**
 * The spread of strength the protocol's own dose tolerance explains, as a fraction of the mean:
 * two bowls dosed at the two ends of ± 0.25 g on 8.25 g differ by about 2 × 0.25 / 8.25 ≈ 6 % in
 * strength (SCA cupping protocol tolerance; in full immersion the solids, and so the strength, follow
 * the dose to first order).
 */
export const doseToleranceSpread = (2 * cuppingRatio.toleranceGramsPerMl) / cuppingRatio.gramsPerMl

/**
 * Mean, spread and uniformity of one lot's bowls on a cupping table. A bowl sits far from the
 * others when Dixon's Q test at 95 % picks it out (Rorabacher, Anal. Chem. 63 (1991) 139–146; the
 * same test as for readings, 3 to 10 bowls) and its gap to the nearest bowl is wider than the
 * protocol's dose tolerance explains (doseToleranceSpread × the mean). The mean keeps every bowl:
 * an uneven bowl is part of what the lot is, not a misreading to set aside.
 * @param bowls - each bowl's strength (%TDS) and extraction yield (%)
 */
export function summarizeBowls(bowls: readonly BowlResult[]): BowlsSummary {
  if (!Array.isArray(bowls) || bowls.length === 0)
    throw new BrewingInputError('bowls', 'Measure at least one bowl of the lot.')
  const strengths = bowls.map((bowl, index) => requireTdsPercent(bowl.tdsPercent, `bowls.${index}.tdsPercent`))
  const summary = summarizeReadings(strengths)
  const yields = bowls.flatMap(bowl => (typeof bowl.yieldPercent === 'number' && Number.isFinite(bowl.yieldPercent) ? [bowl.yieldPercent] : []))
  const meanYieldPercent = yields.length ? yields.reduce((sum, value) => sum + value, 0) / yields.length : null
  let outlier: BowlsSummary['outlier'] = null
  if (summary.outlier) {
    const { index, value } = summary.outlier
    const others = strengths.filter((_, i) => i !== index)
    const gapTdsPercent = Math.min(...others.map(other => Math.abs(other - value)))
    if (gapTdsPercent > doseToleranceSpread * summary.mean)
      outlier = { index, tdsPercent: value, gapTdsPercent, meanOthersTdsPercent: others.reduce((sum, v) => sum + v, 0) / others.length }
  }
  return {
    n: summary.n,
    meanTdsPercent: summary.mean,
    meanYieldPercent,
    sdTdsPercent: summary.sd,
    rangeTdsPercent: summary.range,
    outlier,
    uniform: bowls.length < 3 ? null : outlier === null,
  }
}
