import type { Zone } from '../../../shared/brewing'

/**
 * A brew on the chart; `label` names it (its context and date) in the tooltip; `tag` is a short
 * mark drawn beside it (a cup's blind code, a dial-in attempt's number).
 */
export interface ChartPoint {
  id: string
  tdsPercent: number
  yieldPercent: number
  current?: boolean
  label?: string
  tag?: string
  /** A cell of many brews (bins.ts) rather than one: how many it holds; such a point has no id. */
  count?: number
}

export interface ChartFrame {
  x: { min: number, max: number }
  y: { min: number, max: number }
  /** Grams of beverage per gram of coffee for the dashed lines (strength = extraction / ratio). */
  ratios: number[]
  /** The points on this chart: brews of the other family (espresso on a drip chart) are left off. */
  points: ChartPoint[]
  left: number
}

const floorTo = (value: number, step: number): number => Math.floor(value / step + 1e-9) * step
const ceilTo = (value: number, step: number): number => Math.ceil(value / step - 1e-9) * step

/**
 * The axes of the brewing control chart: the usual window around the zone (14–26 % extraction;
 * 0.9–1.7 %TDS for drip, 6–14 for espresso), widened to show every point of the zone's family.
 */
export function chartFrame(zone: Zone, points: ChartPoint[]): ChartFrame {
  const espresso = zone.tdsPercent.max > 5
  const fits = (point: ChartPoint): boolean => (espresso ? point.tdsPercent >= 3 : point.tdsPercent < 5)
  const kept = points.filter(fits)
  // Loops, not Math.min(...all): a year of brews is too many arguments for one call.
  let [eyMin, eyMax] = [Math.min(14, zone.yieldPercent.min), Math.max(26, zone.yieldPercent.max)]
  let [tdsMin, tdsMax] = [Math.min(espresso ? 6 : 0.9, zone.tdsPercent.min), Math.max(espresso ? 14 : 1.7, zone.tdsPercent.max)]
  for (const point of kept) {
    eyMin = Math.min(eyMin, point.yieldPercent)
    eyMax = Math.max(eyMax, point.yieldPercent)
    tdsMin = Math.min(tdsMin, point.tdsPercent)
    tdsMax = Math.max(tdsMax, point.tdsPercent)
  }
  const yStep = espresso ? 1 : 0.1
  return {
    x: { min: Math.max(0, floorTo(eyMin - 0.5, 2)), max: ceilTo(eyMax + 0.5, 2) },
    y: { min: Math.max(0, floorTo(tdsMin - yStep / 2, yStep)), max: ceilTo(tdsMax + yStep / 2, yStep) },
    ratios: espresso ? [1.5, 2, 2.5, 3] : [14, 16, 18, 20],
    points: kept,
    left: points.reduce((n, point) => n + (fits(point) ? 0 : point.count ?? 1), 0),
  }
}
