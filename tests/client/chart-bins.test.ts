import type { ChartPoint } from '../../src/components/chart/frame'
import { describe, expect, it } from 'vitest'
import { findZonePreset } from '../../shared/brewing'
import { binPoints } from '../../src/components/chart/bins'
import { chartFrame } from '../../src/components/chart/frame'

const us = findZonePreset('us-drip')!
const point = (i: number, tdsPercent: number, yieldPercent: number): ChartPoint => ({ id: `b${i}`, tdsPercent, yieldPercent })

describe('binPoints', () => {
  it('gathers a year of brews into cells that keep every brew counted and sit where their brews do', () => {
    const points = Array.from({ length: 20_000 }, (_, i) => point(i, 1.15 + (i % 41) / 100, 18 + (i % 37) / 10))
    const cells = binPoints(points, us)
    expect(cells.length).toBeLessThan(2000)
    expect(cells.reduce((n, cell) => n + (cell.count ?? 0), 0)).toBe(20_000)
    // A cell names no single brew, so a tap on it opens none.
    expect(cells.every(cell => cell.id === '' && cell.label?.includes('brew'))).toBe(true)
    const { x, y } = chartFrame(us, points)
    expect(cells.every(cell => cell.yieldPercent >= x.min && cell.yieldPercent <= x.max && cell.tdsPercent >= y.min && cell.tdsPercent <= y.max)).toBe(true)
  })

  it('keeps a highlighted brew as its own dot', () => {
    const points = [...Array.from({ length: 3000 }, (_, i) => point(i, 1.3, 20)), { ...point(9, 1.31, 20), current: true }]
    const cells = binPoints(points, us)
    expect(cells.filter(cell => cell.current)).toEqual([{ ...point(9, 1.31, 20), current: true }])
    expect(cells.find(cell => !cell.current)?.count).toBe(3000)
  })

  it('counts brews of the other family, left off the chart, by the brews in them', () => {
    const espresso = Array.from({ length: 2500 }, (_, i) => point(i, 9 + (i % 5) / 10, 20))
    const frame = chartFrame(us, binPoints([...espresso, point(1, 1.3, 20)], us))
    expect(frame.left).toBe(2500)
  })
})
