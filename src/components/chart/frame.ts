import type { Zone } from '../../../shared/brewing'

/**
 * A brew on the chart; `label` names it (its context and date) in the tooltip; `tag` is a short
 * mark drawn beside it (a cup's blind code, a dial-in attempt's number).
 */
export interface ChartPoint { id: string, tdsPercent: number, yieldPercent: number, current?: boolean, label?: string, tag?: string }

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
  const kept = points.filter(point => (espresso ? point.tdsPercent >= 3 : point.tdsPercent < 5))
  const eys = [14, 26, zone.yieldPercent.min, zone.yieldPercent.max, ...kept.map(p => p.yieldPercent)]
  const tdss = [...(espresso ? [6, 14] : [0.9, 1.7]), zone.tdsPercent.min, zone.tdsPercent.max, ...kept.map(p => p.tdsPercent)]
  const yStep = espresso ? 1 : 0.1
  return {
    x: { min: Math.max(0, floorTo(Math.min(...eys) - 0.5, 2)), max: ceilTo(Math.max(...eys) + 0.5, 2) },
    y: { min: Math.max(0, floorTo(Math.min(...tdss) - yStep / 2, yStep)), max: ceilTo(Math.max(...tdss) + yStep / 2, yStep) },
    ratios: espresso ? [1.5, 2, 2.5, 3] : [14, 16, 18, 20],
    points: kept,
    left: points.length - kept.length,
  }
}
