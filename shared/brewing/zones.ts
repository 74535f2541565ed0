import { BrewingInputError, requireFinite, requirePositive, requireTdsPercent } from './errors'
import { formatRatio } from './ratio'
import { formatTds, formatYield, roundHalfUp } from './rounding'

export interface Range { min: number, max: number }

/** A target zone on the brewing control chart: a strength range × an extraction range. */
export interface Zone {
  id: string
  name: string
  tdsPercent: Range
  yieldPercent: Range
  /** Where the numbers come from, shown beside the chart. */
  source: string
  /** A cupping zone judges bowls brewed to a fixed protocol: its verdict never gives brewing advice. */
  purpose?: 'cupping'
}

/** Published drip standards, and an espresso zone from common practice. */
export const zonePresets: readonly Zone[] = [
  { id: 'us-drip', name: 'US drip standard', tdsPercent: { min: 1.15, max: 1.35 }, yieldPercent: { min: 18, max: 22 }, source: 'SCAA brewing standard (2015)' },
  { id: 'european-drip', name: 'European drip standard', tdsPercent: { min: 1.2, max: 1.45 }, yieldPercent: { min: 18, max: 22 }, source: 'European brewing standard (secondary sources)' },
  { id: 'nordic-drip', name: 'Nordic drip standard', tdsPercent: { min: 1.3, max: 1.55 }, yieldPercent: { min: 18, max: 22 }, source: 'Norwegian brewing standard (sources give 1.50 or 1.55 as the upper strength)' },
  { id: 'espresso', name: 'Espresso', tdsPercent: { min: 8, max: 12 }, yieldPercent: { min: 18, max: 22 }, source: 'Common practice; no published standard' },
]

/**
 * Cupping bowls: 18–22 % extraction as for filter brews, and the strength that range gives in a
 * full-immersion bowl at the SCA cupping ratio of 8.25 g ± 0.25 g per 150 mL (0.95 %TDS at 8.0 g
 * and 18 %, 1.23 %TDS at 8.5 g and 22 %, rounded out to 1.25). Kept apart from the presets a phone or a team chooses
 * from: it judges every lot's bowl, whatever the team's default.
 */
export const cuppingZone: Zone = {
  id: 'cupping',
  name: 'Cupping zone',
  tdsPercent: { min: 0.95, max: 1.25 },
  yieldPercent: { min: 18, max: 22 },
  source: 'Common practice: 18–22 % extraction at the SCA cupping ratio (8.25 g ± 0.25 g per 150 mL) in full immersion',
  purpose: 'cupping',
}

/** A zone preset by id, or undefined. */
export const findZonePreset = (id: string): Zone | undefined => zonePresets.find(zone => zone.id === id)

/**
 * Filter coffee and espresso live an order of magnitude apart in strength (about 1–2 %TDS against
 * 7–12 %), so a brew is judged against a zone of its own family: espresso zones reach above 5 %TDS.
 */
export type ZoneFamily = 'filter' | 'espresso'
export const zoneFamily = (zone: Zone): ZoneFamily => (zone.tdsPercent.max > 5 ? 'espresso' : 'filter')
export const methodFamily = (method: string): ZoneFamily => (method === 'espresso' ? 'espresso' : 'filter')
/** The preset a family falls back to when the team has chosen none. */
export const defaultZone: Readonly<Record<ZoneFamily, Zone>> = { filter: zonePresets[0]!, espresso: zonePresets[3]! }

function checkRange(range: Range | undefined, field: string, label: string, upper: number): Range {
  if (!range)
    throw new BrewingInputError(field, `${label} needs a lower and an upper limit.`)
  requirePositive(range.min, `${field}.min`, `The lower ${label.toLowerCase()} limit`)
  requireFinite(range.max, `${field}.max`, `The upper ${label.toLowerCase()} limit`)
  if (range.max <= range.min)
    throw new BrewingInputError(`${field}.max`, `The upper ${label.toLowerCase()} limit must be above the lower one.`)
  if (range.max >= upper)
    throw new BrewingInputError(`${field}.max`, `The upper ${label.toLowerCase()} limit must be below ${upper} %.`)
  return { min: range.min, max: range.max }
}

/** A team's own zone, checked. */
export function defineZone(input: { id: string, name: string, tdsPercent: Range, yieldPercent: Range, source?: string }): Zone {
  if (!input.name?.trim())
    throw new BrewingInputError('name', 'Give the zone a name.')
  return {
    id: input.id,
    name: input.name.trim(),
    tdsPercent: checkRange(input.tdsPercent, 'tdsPercent', 'Strength', 100),
    yieldPercent: checkRange(input.yieldPercent, 'yieldPercent', 'Extraction', 100),
    source: input.source?.trim() || 'Team zone',
  }
}

export type Position = 'low' | 'in' | 'high'

export interface ZoneVerdict {
  strength: Position
  extraction: Position
  inZone: boolean
  /** A few words for the result panel, e.g. "Under-extracted and weak". */
  headline: string
  /** What to change, with its size: extraction first (it moves strength too), then the ratio. */
  adjustments: string[]
  /** Extraction points to gain (+) or lose (−) to reach the middle of the zone's extraction range. */
  yieldGap: number
  /**
   * Grams of beverage per gram of coffee now, and the one that would land in the middle of the
   * zone's strength at the current extraction (strength = EY / ratio).
   */
  beverageRatio: { current: number, target: number }
}

const cuppingHeadlines: Record<Position, Record<Position, string>> = {
  low: { low: 'Below the cupping zone in strength and extraction', in: 'Below the cupping zone in extraction', high: 'Stronger, but extracted below the cupping zone' },
  in: { low: 'Below the cupping zone in strength', in: 'Inside the cupping zone', high: 'Above the cupping zone in strength' },
  high: { low: 'Weaker, but extracted above the cupping zone', in: 'Above the cupping zone in extraction', high: 'Above the cupping zone in strength and extraction' },
}
const cuppingNote = 'A cupping bowl is compared, not corrected: every bowl on the table follows the same protocol.'

const place = (value: number, range: Range): Position => (value < range.min ? 'low' : value > range.max ? 'high' : 'in')

const headlines: Record<Position, Record<Position, string>> = {
  low: { low: 'Under-extracted and weak', in: 'Under-extracted', high: 'Under-extracted and strong' },
  in: { low: 'Weak', in: 'In the zone', high: 'Strong' },
  high: { low: 'Over-extracted and weak', in: 'Over-extracted', high: 'Over-extracted and strong' },
}

/**
 * Where a brew sits against a zone and what to change next. Extraction is moved by grind, contact
 * time and temperature; strength at a given extraction is moved by the brew ratio. A cupping zone
 * only says where a bowl sits: its bowls follow a fixed protocol and are never dialled in.
 * @param zone - the target zone
 * @param measured - the brew's results
 * @param measured.tdsPercent - strength, %TDS
 * @param measured.yieldPercent - extraction yield, %
 */
export function zoneVerdict(zone: Zone, measured: { tdsPercent: number, yieldPercent: number }): ZoneVerdict {
  const tds = requireTdsPercent(measured.tdsPercent)
  const ey = requirePositive(measured.yieldPercent, 'yieldPercent', 'The extraction yield')
  // Judged at the precision shown (TDS 2 decimals, EY 1): a mean of 1.3500000000000003 reads 1.35
  // and sits on the zone's edge, inside, as the person sees it.
  const strength = place(roundHalfUp(tds, 2), zone.tdsPercent)
  const extraction = place(roundHalfUp(ey, 1), zone.yieldPercent)
  const targetTds = (zone.tdsPercent.min + zone.tdsPercent.max) / 2
  const beverageRatio = { current: ey / tds, target: ey / targetTds }
  const inZone = strength === 'in' && extraction === 'in'
  const targetEy = (zone.yieldPercent.min + zone.yieldPercent.max) / 2
  const yieldGap = targetEy - ey
  // A cupping bowl is read, never adjusted: no brewing advice for it.
  if (zone.purpose === 'cupping')
    return { strength, extraction, inZone, headline: cuppingHeadlines[extraction][strength], adjustments: [cuppingNote], yieldGap, beverageRatio }
  const gapWords = `about ${formatYield(Math.abs(yieldGap))} points (from ${formatYield(ey)} % to ${formatYield(targetEy)} %, the middle of the zone)`
  const ratios = `brew ratio about ${formatRatio(beverageRatio.target)} instead of ${formatRatio(beverageRatio.current)} (grams of beverage per gram of coffee)`

  const adjustments: string[] = []
  if (extraction === 'low')
    adjustments.push(`Raise the extraction ${gapWords}: grind finer, lengthen the contact time, or brew a little hotter.`)
  else if (extraction === 'high')
    adjustments.push(`Lower the extraction ${gapWords}: grind coarser, shorten the contact time, or brew a little cooler.`)
  if (strength === 'low')
    adjustments.push(`Make it stronger with less beverage per gram of coffee: ${ratios}.`)
  else if (strength === 'high')
    adjustments.push(`Make it weaker with more beverage per gram of coffee: ${ratios}, or add water after brewing.`)
  if (adjustments.length === 0)
    adjustments.push('Keep this recipe: strength and extraction are both inside the zone.')
  else if (extraction !== 'in' && strength !== 'in')
    adjustments.push('Change the extraction first and measure again: it moves the strength too.')

  return { strength, extraction, inZone, headline: headlines[extraction][strength], adjustments, yieldGap, beverageRatio }
}

/** A zone's ranges as a person reads them, at display precision: "1.15–1.35 %TDS · 18.0–22.0 % EY". */
export function zoneRangesText(zone: Pick<Zone, 'tdsPercent' | 'yieldPercent'>): string {
  return `${formatTds(zone.tdsPercent.min)}–${formatTds(zone.tdsPercent.max)} %TDS · ${formatYield(zone.yieldPercent.min)}–${formatYield(zone.yieldPercent.max)} % EY`
}
