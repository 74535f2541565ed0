import { describe, expect, it } from 'vitest'
import { defaultZone, defineZone, findZonePreset, methodFamily, zoneFamily, zonePresets, zoneVerdict } from '../../shared/brewing'

describe('zonePresets', () => {
  it.each([
    // SCAA brewing standard (2015): TDS 1.15–1.35 %, EY 18–22 %.
    ['us-drip', 1.15, 1.35],
    // European brewing standard (secondary sources): TDS 1.20–1.45 %, EY 18–22 %.
    ['european-drip', 1.2, 1.45],
    // Norwegian brewing standard: TDS 1.30–1.55 % (sources give 1.50 or 1.55 as the top), EY 18–22 %.
    ['nordic-drip', 1.3, 1.55],
  ])('%s covers %f–%f %%TDS and 18–22 %% EY', (id, min, max) => {
    const zone = findZonePreset(id)!
    expect(zone.tdsPercent).toEqual({ min, max })
    expect(zone.yieldPercent).toEqual({ min: 18, max: 22 })
    expect(zone.source).not.toBe('')
  })

  it('contains the chart\'s historical ideal of about 1.25 %TDS and 20 % EY (Lockhart 1957) in the US zone', () => {
    expect(zoneVerdict(findZonePreset('us-drip')!, { tdsPercent: 1.25, yieldPercent: 20 }).inZone).toBe(true)
  })
})

describe('zoneVerdict', () => {
  const us = findZonePreset('us-drip')!

  it('keeps a brew inside the zone as it is', () => {
    const verdict = zoneVerdict(us, { tdsPercent: 1.3, yieldPercent: 20.5 })
    expect(verdict).toMatchObject({ strength: 'in', extraction: 'in', inZone: true, headline: 'In the zone' })
    expect(verdict.adjustments).toEqual(['Keep this recipe: strength and extraction are both inside the zone.'])
  })

  it('tells an under-extracted brew to grind finer, brew longer or hotter', () => {
    const verdict = zoneVerdict(us, { tdsPercent: 1.25, yieldPercent: 16.8 })
    expect(verdict).toMatchObject({ strength: 'in', extraction: 'low', headline: 'Under-extracted' })
    expect(verdict.adjustments[0]).toMatch(/grind finer.*contact time.*hotter/)
  })

  it('sizes the extraction advice: 16.8 % against 18–22 % is 3.2 points short of the middle', () => {
    // The middle of 18–22 % is 20.0 %; 20.0 − 16.8 = 3.2 points.
    const verdict = zoneVerdict(us, { tdsPercent: 1.25, yieldPercent: 16.8 })
    expect(verdict.yieldGap).toBeCloseTo(3.2, 10)
    expect(verdict.adjustments[0]).toMatch(/^Raise the extraction about 3\.2 points \(from 16\.8 % to 20\.0 %, the middle of the zone\): grind finer/)
  })

  it('tells an over-extracted brew to grind coarser, brew shorter or cooler', () => {
    const verdict = zoneVerdict(us, { tdsPercent: 1.3, yieldPercent: 23.4 })
    expect(verdict.extraction).toBe('high')
    expect(verdict.adjustments[0]).toMatch(/grind coarser.*shorten.*cooler/)
  })

  it('moves strength at a given extraction with the ratio, and gives the number', () => {
    // At 20 % EY a 1.25 %TDS target needs 20 / 1.25 = 16.0 g of beverage per gram of coffee.
    const verdict = zoneVerdict(us, { tdsPercent: 1.05, yieldPercent: 20 })
    expect(verdict).toMatchObject({ strength: 'low', extraction: 'in', headline: 'Weak' })
    expect(verdict.beverageRatio.target).toBeCloseTo(16, 10)
    expect(verdict.beverageRatio.current).toBeCloseTo(19.05, 2)
    // 20 / 1.05 = 19.048, shown half up as 1:19.0.
    expect(verdict.adjustments[0]).toContain('brew ratio about 1:16.0 instead of 1:19.0 (grams of beverage per gram of coffee)')
  })

  it('tells a strong brew to use more beverage per gram of coffee', () => {
    const verdict = zoneVerdict(us, { tdsPercent: 1.5, yieldPercent: 20 })
    expect(verdict.strength).toBe('high')
    expect(verdict.adjustments[0]).toContain('more beverage per gram of coffee')
  })

  it('says to fix extraction first when both axes are off', () => {
    const verdict = zoneVerdict(us, { tdsPercent: 1.5, yieldPercent: 24 })
    expect(verdict.headline).toBe('Over-extracted and strong')
    expect(verdict.adjustments.at(-1)).toContain('Change the extraction first')
  })

  it('counts the zone\'s edges as inside', () => {
    expect(zoneVerdict(us, { tdsPercent: 1.15, yieldPercent: 22 }).inZone).toBe(true)
  })

  it('judges at the precision shown, so float noise on an edge stays inside', () => {
    const mean = (1.34 + 1.35 + 1.36) / 3
    expect(mean).toBeGreaterThan(1.35)
    expect(zoneVerdict(us, { tdsPercent: mean, yieldPercent: 22.04 }).inZone).toBe(true)
    expect(zoneVerdict(us, { tdsPercent: 1.355, yieldPercent: 20 }).strength).toBe('high')
  })
})

describe('defineZone', () => {
  it('accepts a team\'s own zone', () => {
    const zone = defineZone({ id: 'saltmarsh-filter', name: ' Saltmarsh filter ', tdsPercent: { min: 1.28, max: 1.42 }, yieldPercent: { min: 19, max: 21.5 } })
    expect(zone).toMatchObject({ name: 'Saltmarsh filter', source: 'Team zone' })
  })

  it('refuses an upside-down range, naming the limit', () => {
    expect(() => defineZone({ id: 'x', name: 'X', tdsPercent: { min: 1.4, max: 1.2 }, yieldPercent: { min: 18, max: 22 } }))
      .toThrow(expect.objectContaining({ field: 'tdsPercent.max' }))
  })
})

describe('zoneFamily and methodFamily', () => {
  it('put every drip preset with filter brews and the espresso zone with espresso', () => {
    // Drip standards (SCAA 2015, European, Norwegian) top out near 1.55 %TDS; espresso runs 8–12 %
    // (common practice).
    expect(zonePresets.filter(zone => zoneFamily(zone) === 'filter').map(zone => zone.id)).toEqual(['us-drip', 'european-drip', 'nordic-drip'])
    expect(zoneFamily(defaultZone.espresso)).toBe('espresso')
    expect(zoneFamily(defaultZone.filter)).toBe('filter')
    expect(['percolation', 'immersion', 'espresso'].map(methodFamily)).toEqual(['filter', 'filter', 'espresso'])
  })
})
