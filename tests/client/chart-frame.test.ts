import { describe, expect, it } from 'vitest'
import { findZonePreset } from '../../shared/brewing'
import { chartFrame } from '../../src/components/chart/frame'

const us = findZonePreset('us-drip')!
const espresso = findZonePreset('espresso')!
const point = (tdsPercent: number, yieldPercent: number) => ({ id: `${tdsPercent}-${yieldPercent}`, tdsPercent, yieldPercent })

describe('chartFrame', () => {
  it('keeps the usual drip window when every brew fits in it', () => {
    // The window around the ideal of 1.25 %TDS and 20 % (Lockhart 1957), as charts commonly draw it.
    expect(chartFrame(us, [point(1.35, 21.6)])).toMatchObject({ x: { min: 12, max: 28 }, y: { min: 0.8, max: 1.8 }, left: 0 })
  })

  it('widens to show a weak, under-extracted brew', () => {
    const frame = chartFrame(us, [point(0.62, 11.3)])
    expect(frame.x.min).toBeLessThanOrEqual(11.3)
    expect(frame.y.min).toBeLessThanOrEqual(0.62)
    expect(frame.points).toHaveLength(1)
  })

  it('leaves espresso off a drip chart and drip off an espresso chart, counting them', () => {
    const brews = [point(1.3, 20), point(9.5, 19.8)]
    expect(chartFrame(us, brews)).toMatchObject({ left: 1, points: [brews[0]] })
    expect(chartFrame(espresso, brews)).toMatchObject({ left: 1, points: [brews[1]], y: { min: 5, max: 15 } })
  })
})
