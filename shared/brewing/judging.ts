import type { Range } from './zones'
import { BrewingInputError, requireFinite, requireNonNegative } from './errors'
import { formatTds, formatYield, roundHalfUp } from './rounding'

// The judge's arithmetic for a competition round: each cup's pours summed up against the round's
// zone and tolerance, and which readings a distilled-water zero check covers. Percent values are
// percent (1.30 means 1.30 %TDS).

/** How far outside the zone a cup may sit, per axis, before it is flagged: %TDS and % EY. */
export interface RoundTolerance { tdsPercent: number, yieldPercent: number }

/** What a cup should get: pours, and readings of each pour. */
export interface CupExpectation { pours: number, readingsPerPour: number }

/** One pour of a cup: its result (null until it has one) and how many readings count towards it. */
export interface PourFigures { tdsPercent: number | null, yieldPercent: number | null, readings: number }

/** Mean and spread of one figure over a cup's pours. */
export interface PourSpread {
  n: number
  mean: number
  /** Sample standard deviation (n − 1); 0 for a single pour. */
  sd: number
  /** Highest minus lowest pour. */
  range: number
}

/** Where a cup's mean sits on one axis against the zone, and whether it is past the tolerance. */
export interface AxisStanding {
  axis: 'strength' | 'extraction'
  position: 'low' | 'in' | 'high'
  /** Distance from the zone's nearest edge, at display precision (0 inside the zone). */
  outsideBy: number
  tolerance: number
  flagged: boolean
}

export interface CupSummary {
  pours: number
  poursExpected: number
  /** Readings that count towards what is expected: at most the expected number per pour. */
  readingsDone: number
  readingsExpected: number
  /** As many pours as expected, each with as many readings as expected. */
  complete: boolean
  tds: PourSpread | null
  yield: PourSpread | null
  strength: AxisStanding | null
  extraction: AxisStanding | null
  /** Past the tolerance on at least one axis. */
  flagged: boolean
}

/**
 * Mean, standard deviation and range of a figure over pours.
 * @param values - one figure per pour (%TDS or % EY)
 */
export function spreadOf(values: readonly number[]): PourSpread {
  if (values.length === 0)
    throw new BrewingInputError('pours', 'A cup needs at least one measured pour.')
  values.forEach((value, index) => requireFinite(value, `pours.${index}`, `Pour ${index + 1}`))
  const n = values.length
  const mean = values.reduce((sum, v) => sum + v, 0) / n
  const sd = n > 1 ? Math.sqrt(values.reduce((sum, v) => sum + (v - mean) ** 2, 0) / (n - 1)) : 0
  return { n, mean, sd, range: Math.max(...values) - Math.min(...values) }
}

/**
 * One axis of a cup against the zone, judged at the precision shown (2 decimals of %TDS, 1 of
 * % EY) as the verdict on the Bench is.
 * @param axis - strength (%TDS) or extraction (% EY)
 * @param mean - the cup's mean over its pours, in percent
 * @param range - the zone's range on this axis, in percent
 * @param tolerance - allowed distance outside the range, in percent
 */
export function axisStanding(axis: AxisStanding['axis'], mean: number, range: Range, tolerance: number): AxisStanding {
  requireFinite(mean, axis, `The mean ${axis}`)
  requireNonNegative(tolerance, `tolerance.${axis}`, `The ${axis} tolerance`)
  const decimals = axis === 'strength' ? 2 : 1
  const shown = roundHalfUp(mean, decimals)
  const position = shown < range.min ? 'low' : shown > range.max ? 'high' : 'in'
  const outsideBy = position === 'low' ? roundHalfUp(range.min - shown, decimals) : position === 'high' ? roundHalfUp(shown - range.max, decimals) : 0
  // Both at display precision, so a distance equal to the tolerance stays inside it.
  return { axis, position, outsideBy, tolerance, flagged: outsideBy > roundHalfUp(tolerance, decimals) }
}

/**
 * A cup's pours against the round: how many are done, the mean and spread of strength and
 * extraction over the measured pours, and whether the mean is past the tolerance on either axis.
 * @param pours - every pour of the cup (pours without a result count as started, not measured)
 * @param zone - the round's target zone
 * @param zone.tdsPercent - the zone's strength range, %TDS
 * @param zone.yieldPercent - the zone's extraction range, % EY
 * @param tolerance - allowed distance outside the zone per axis
 * @param expected - pours per cup and readings per pour the round asks for
 */
export function summarizeCup(pours: readonly PourFigures[], zone: { tdsPercent: Range, yieldPercent: Range }, tolerance: RoundTolerance, expected: CupExpectation): CupSummary {
  if (!Number.isInteger(expected.pours) || expected.pours < 1)
    throw new BrewingInputError('expected.pours', 'A round expects at least one pour per cup.')
  if (!Number.isInteger(expected.readingsPerPour) || expected.readingsPerPour < 1)
    throw new BrewingInputError('expected.readingsPerPour', 'A round expects at least one reading per pour.')
  // A pour poured again counts once: the best-read pours are the ones that fill the expectation.
  const counted = pours.map(pour => Math.min(pour.readings, expected.readingsPerPour)).sort((a, b) => b - a).slice(0, expected.pours)
  const readingsExpected = expected.pours * expected.readingsPerPour
  const readingsDone = counted.reduce((sum, n) => sum + n, 0)
  const measured = pours.filter(pour => pour.tdsPercent !== null && pour.yieldPercent !== null)
  const tds = measured.length ? spreadOf(measured.map(pour => pour.tdsPercent!)) : null
  const ey = measured.length ? spreadOf(measured.map(pour => pour.yieldPercent!)) : null
  const strength = tds && axisStanding('strength', tds.mean, zone.tdsPercent, tolerance.tdsPercent)
  const extraction = ey && axisStanding('extraction', ey.mean, zone.yieldPercent, tolerance.yieldPercent)
  return {
    pours: pours.length,
    poursExpected: expected.pours,
    readingsDone,
    readingsExpected,
    complete: readingsDone >= readingsExpected,
    tds,
    yield: ey,
    strength,
    extraction,
    flagged: Boolean(strength?.flagged || extraction?.flagged),
  }
}

/** One axis in words: "strength 0.08 %TDS above the zone, 0.03 past the 0.05 allowed". */
export function describeStanding(standing: AxisStanding): string {
  if (standing.position === 'in')
    return `${standing.axis} inside the zone`
  const format = standing.axis === 'strength' ? formatTds : formatYield
  const unit = standing.axis === 'strength' ? ' %TDS' : ' % EY'
  const side = standing.position === 'low' ? 'below' : 'above'
  const base = `${standing.axis} ${format(standing.outsideBy)}${unit} ${side} the zone`
  if (!standing.flagged)
    return `${base}, within the ${format(standing.tolerance)} allowed`
  const past = roundHalfUp(standing.outsideBy - standing.tolerance, standing.axis === 'strength' ? 2 : 1)
  return standing.tolerance > 0 ? `${base}, ${format(past)} past the ${format(standing.tolerance)} allowed` : `${base}, no distance allowed`
}

/** A cup's flag in words, or '' when it is not flagged: the flagged axes, semicolon-separated. */
export function flagText(summary: Pick<CupSummary, 'strength' | 'extraction'>): string {
  return [summary.strength, summary.extraction].filter(s => s?.flagged).map(s => describeStanding(s!)).join('; ')
}

const offsetPattern = /(?:Z|([+-])(\d{2}):?(\d{2}))$/i

/**
 * The UTC offset an ISO 8601 time is written in, in minutes east of UTC: "+02:00" → 120, "Z" → 0.
 * @param iso - a date and time with its offset
 */
export function offsetMinutesOf(iso: string): number {
  const match = offsetPattern.exec(iso)
  if (!match)
    throw new BrewingInputError('checkedAt', 'The time must carry its UTC offset.')
  return match[1] ? (match[1] === '-' ? -1 : 1) * (Number(match[2]) * 60 + Number(match[3])) : 0
}

/** The calendar day (YYYY-MM-DD) an instant falls on at a UTC offset, in minutes east of UTC. */
export function dayAt(iso: string, offsetMinutes: number): string {
  const at = Date.parse(iso)
  if (Number.isNaN(at))
    throw new BrewingInputError('time', 'The time must be an ISO 8601 date and time.')
  return new Date(at + offsetMinutes * 60_000).toISOString().slice(0, 10)
}

/**
 * Whether a zero check covers a reading: taken on the same calendar day, counted where the check
 * was made (its own UTC offset), so every phone and the server agree whatever their time zone.
 * @param checkedAt - when the check was made, with the phone's UTC offset
 * @param takenAt - when the reading was taken
 */
export function sameDayAsCheck(checkedAt: string, takenAt: string): boolean {
  const offset = offsetMinutesOf(checkedAt)
  return dayAt(checkedAt, offset) === dayAt(takenAt, offset)
}

/** A moment written with a UTC offset: "2026-05-01T09:12:30.000+02:00" for offset 120. */
export function isoWithOffset(date: Date, offsetMinutes: number): string {
  const local = new Date(date.getTime() + offsetMinutes * 60_000).toISOString().slice(0, 23)
  const sign = offsetMinutes < 0 ? '-' : '+'
  const abs = Math.abs(offsetMinutes)
  return `${local}${sign}${String(Math.floor(abs / 60)).padStart(2, '0')}:${String(abs % 60).padStart(2, '0')}`
}
