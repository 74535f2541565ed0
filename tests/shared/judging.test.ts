import { describe, expect, it } from 'vitest'
import { axisStanding, BrewingInputError, dayAt, describeStanding, findZonePreset, flagText, isoWithOffset, offsetMinutesOf, sameDayAsCheck, spreadOf, summarizeCup } from '../../shared/brewing'

// European drip standard (secondary sources): 1.20–1.45 %TDS, 18–22 % EY (shared/brewing/zones.ts).
const zone = findZonePreset('european-drip')!
const tolerance = { tdsPercent: 0.05, yieldPercent: 0.5 }
const expected = { pours: 2, readingsPerPour: 3 }

describe('spreadOf', () => {
  it('gives the mean, the sample standard deviation and the range of the pours', () => {
    // Worked by hand: mean 1.34, deviations ±0.02, s = √(0.0008 / 1) = 0.028284…
    const spread = spreadOf([1.32, 1.36])
    expect(spread.mean).toBeCloseTo(1.34, 12)
    expect(spread.sd).toBeCloseTo(Math.sqrt(0.0008), 12)
    expect(spread.range).toBeCloseTo(0.04, 12)
  })

  it('refuses a cup without a measured pour, naming the pours', () => {
    expect(() => spreadOf([])).toThrow(BrewingInputError)
    expect(() => spreadOf([])).toThrow(expect.objectContaining({ field: 'pours' }))
  })
})

describe('axisStanding', () => {
  it.each([
    // mean, position, distance outside the zone, flagged at a 0.05 tolerance
    [1.30, 'in', 0, false],
    [1.45, 'in', 0, false],
    [1.50, 'high', 0.05, false],
    [1.51, 'high', 0.06, true],
    [1.1449, 'low', 0.06, true],
  ] as const)('puts a mean of %f %%TDS %s the zone, %f outside, flagged: %s', (mean, position, outsideBy, flagged) => {
    expect(axisStanding('strength', mean, zone.tdsPercent, 0.05)).toMatchObject({ position, outsideBy, flagged })
  })

  it('judges at the precision shown, so 1.4549 reads 1.45 and stays inside', () => {
    expect(axisStanding('strength', 1.4549, zone.tdsPercent, 0).position).toBe('in')
  })

  it('flags anything outside the zone when no distance is allowed', () => {
    expect(axisStanding('extraction', 22.1, zone.yieldPercent, 0)).toMatchObject({ position: 'high', outsideBy: 0.1, flagged: true })
  })
})

describe('summarizeCup', () => {
  it('counts pours and readings against what the round expects, and means over the measured pours', () => {
    const summary = summarizeCup([{ tdsPercent: 1.38, yieldPercent: 20.1, readings: 3 }, { tdsPercent: 1.4, yieldPercent: 20.5, readings: 2 }], zone, tolerance, expected)
    expect(summary).toMatchObject({ pours: 2, poursExpected: 2, readingsDone: 5, readingsExpected: 6, complete: false, flagged: false })
    expect(summary.tds!.mean).toBeCloseTo(1.39, 12)
    expect(summary.yield!.range).toBeCloseTo(0.4, 12)
  })

  it('counts a pour poured again once: the best-read pours fill what is expected', () => {
    const pours = [{ tdsPercent: 1.3, yieldPercent: 20, readings: 1 }, { tdsPercent: 1.31, yieldPercent: 20, readings: 3 }, { tdsPercent: 1.32, yieldPercent: 20, readings: 4 }]
    expect(summarizeCup(pours, zone, tolerance, expected)).toMatchObject({ pours: 3, readingsDone: 6, complete: true })
  })

  it('flags a cup past the tolerance and says which axis and by how much', () => {
    const summary = summarizeCup([{ tdsPercent: 1.52, yieldPercent: 17.2, readings: 3 }, { tdsPercent: 1.54, yieldPercent: 17.4, readings: 3 }], zone, tolerance, expected)
    expect(summary.flagged).toBe(true)
    expect(flagText(summary)).toBe('strength 0.08 %TDS above the zone, 0.03 past the 0.05 allowed; extraction 0.7 % EY below the zone, 0.2 past the 0.5 allowed')
  })

  it('leaves a started pour without a result out of the mean', () => {
    const summary = summarizeCup([{ tdsPercent: 1.3, yieldPercent: 20, readings: 3 }, { tdsPercent: null, yieldPercent: null, readings: 0 }], zone, tolerance, expected)
    expect(summary.tds).toMatchObject({ n: 1, mean: 1.3 })
    expect(summary.readingsDone).toBe(3)
  })

  it('refuses a round that expects no pour', () => {
    expect(() => summarizeCup([], zone, tolerance, { pours: 0, readingsPerPour: 3 })).toThrow(expect.objectContaining({ field: 'expected.pours' }))
  })
})

describe('describeStanding', () => {
  it('says when a cup is outside the zone but within the distance allowed', () => {
    expect(describeStanding(axisStanding('strength', 1.48, zone.tdsPercent, 0.05))).toBe('strength 0.03 %TDS above the zone, within the 0.05 allowed')
  })
})

describe('zero-check days', () => {
  it('reads the UTC offset a time is written in', () => {
    expect(offsetMinutesOf('2026-05-01T09:00:00.000+02:00')).toBe(120)
    expect(offsetMinutesOf('2026-05-01T09:00:00-05:30')).toBe(-330)
    expect(offsetMinutesOf('2026-05-01T09:00:00Z')).toBe(0)
  })

  it('puts an instant on the calendar day of an offset', () => {
    expect(dayAt('2026-05-01T23:30:00Z', 120)).toBe('2026-05-02')
    expect(dayAt('2026-05-01T23:30:00Z', 0)).toBe('2026-05-01')
  })

  it('covers a reading taken the same day where the check was made, whatever the reading\'s zone', () => {
    const check = '2026-05-01T08:00:00.000+10:00'
    // 2026-05-01 18:00 at +10:00 is 08:00 UTC; 2026-05-02 00:30 at +10:00 is 14:30 UTC the day before.
    expect(sameDayAsCheck(check, '2026-05-01T08:00:00.000Z')).toBe(true)
    expect(sameDayAsCheck(check, '2026-05-01T14:30:00.000Z')).toBe(false)
    expect(sameDayAsCheck(check, '2026-04-30T13:59:00.000Z')).toBe(false)
  })

  it('writes a moment with an offset that reads back as the same instant', () => {
    const at = new Date('2026-05-01T22:15:30.250Z')
    const written = isoWithOffset(at, 150)
    expect(written).toBe('2026-05-02T00:45:30.250+02:30')
    expect(Date.parse(written)).toBe(at.getTime())
    expect(isoWithOffset(at, -300)).toBe('2026-05-01T17:15:30.250-05:00')
  })
})
