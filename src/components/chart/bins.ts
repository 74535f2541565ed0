import type { Zone } from '../../../shared/brewing'
import type { ChartPoint } from './frame'
import { chartFrame } from './frame'

/** Beyond this many brews the chart draws cells of brews instead of one dot each. */
export const pointLimit = 2000
/** Cells across each axis of the chart's window: a cell is about 6 px on a phone. */
const cellsPerAxis = 60

/**
 * Brews gathered into the cells of a grid over the chart's window, each cell drawn once where its
 * brews sit on average, with how many it holds: a year of brews draws as a few hundred marks, and
 * a cell keeps the shape of the cloud. A highlighted brew keeps its own dot.
 */
export function binPoints(points: ChartPoint[], zone: Zone): ChartPoint[] {
  const { x, y } = chartFrame(zone, points)
  const width = (x.max - x.min) / cellsPerAxis
  const height = (y.max - y.min) / cellsPerAxis
  const cells = new Map<number, { n: number, tds: number, ey: number }>()
  const own: ChartPoint[] = []
  for (const point of points) {
    if (point.current) {
      own.push(point)
      continue
    }
    const key = Math.floor((point.yieldPercent - x.min) / width) * 1000 + Math.floor((point.tdsPercent - y.min) / height)
    const cell = cells.get(key) ?? { n: 0, tds: 0, ey: 0 }
    cell.n += 1
    cell.tds += point.tdsPercent
    cell.ey += point.yieldPercent
    cells.set(key, cell)
  }
  const binned = [...cells.values()].map(cell => ({ id: '', tdsPercent: cell.tds / cell.n, yieldPercent: cell.ey / cell.n, count: cell.n, label: cell.n === 1 ? 'One brew' : `${cell.n} brews here` }))
  return [...binned, ...own]
}
