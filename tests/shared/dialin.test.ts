import type { AttemptFigures, DialInTarget } from '../../shared/brewing'
import { describe, expect, it } from 'vitest'
import { percolationYield, readGrindSetting, similarBrews, suggestNextChange } from '../../shared/brewing'

// A team zone a little stronger than the US drip standard, with the recipe's target inside it.
const target: DialInTarget = { tdsPercent: 1.3, yieldPercent: 20.5, zone: { tdsPercent: { min: 1.28, max: 1.4 }, yieldPercent: { min: 20, max: 22 } } }
function pour(grind: string, yieldPercent: number, extra: Partial<AttemptFigures> = {}): AttemptFigures {
  return {
    method: 'percolation',
    dose: 15,
    beverageMass: 234,
    waterMass: null,
    tdsPercent: yieldPercent * 15 / 234,
    yieldPercent,
    grindSetting: grind,
    waterTemperatureC: 94,
    ...extra,
  }
}
// The team's pour-overs on this grinder: one click finer gains exactly 0.5 points of extraction.
const history = [pour('20 clicks', 21.5), pour('22 clicks', 20.5), pour('24 clicks', 19.5), pour('26 clicks', 18.5)]

describe('suggestNextChange', () => {
  it('matches the worked example computed by hand', () => {
    // Worked by hand, not by the code under test:
    //   attempt: 15.0 g, 234.0 g of beverage, 1.25 %TDS → EY = 1.25 × 234 / 15 = 19.5 %.
    //   Extraction: target 20.5 % − 19.5 % = +1.0 point. The history's line is EY = 31.5 − 0.5 × clicks
    //   (slope −0.5 %/click, r = −1), so the step is 1.0 / −0.5 = −2 clicks: 24 → 22 clicks.
    //   Strength at the measured 19.5 %: beverage = 19.5 × 15 / 1.30 = 225.0 g; water = 225.0 +
    //   LRR 2.0 (common practice) × 15 = 255.0 g; or the same 234 g from 234 × 1.30 / 19.5 = 15.6 g.
    const attempt = pour('24 clicks', 19.5, { tdsPercent: 1.25 })
    expect(percolationYield({ tdsPercent: 1.25, beverageMass: 234, dose: 15 })).toBeCloseTo(19.5, 10)
    const next = suggestNextChange(attempt, target, history)
    expect(next.extraction).toMatchObject({ position: 'low', grind: { from: 24, to: 22, unit: 'clicks', brews: 4, beyondHistory: false } })
    expect(next.extraction!.gapPoints).toBeCloseTo(1, 10)
    expect(next.extraction!.grind!.slope).toBeCloseTo(-0.5, 10)
    expect(next.extraction!.grind!.r).toBeCloseTo(-1, 10)
    expect(next.strength!.beverageMass).toBeCloseTo(225, 10)
    expect(next.strength!.waterMass).toBeCloseTo(255, 10)
    expect(next.strength!.dose).toBeCloseTo(15.6, 10)
    expect(next.actions).toEqual([
      'Raise the extraction 1.0 points: grind finer, from 24 clicks to 22 clicks.',
      'For 1.30 %TDS at 19.5 % EY: pour 255.0 g of water on 15.0 g (225.0 g of beverage), or dose 15.6 g for the same beverage.',
    ])
    expect(next.reasoning).toBe('Landed at 1.25 %TDS and 19.5 % EY against a target of 1.30 %TDS and 20.5 %; the team\'s 4 similar brews move 0.5 points per click (r = -1.00); the recipe solver puts 1.30 %TDS at 19.5 % EY at 225.0 g of beverage per 15.0 g; change the extraction first: it moves the strength too.')
  })

  it('says when the team\'s history is too thin to size a grind step, and still gives the direction', () => {
    const next = suggestNextChange(pour('24 clicks', 19.5, { tdsPercent: 1.3 }), target, history.slice(0, 2))
    expect(next.extraction).toMatchObject({ grind: null, noStep: 'the team\'s 2 similar percolation brews at 2 grind settings are short of the 4 at 2 or more a grind step needs' })
    expect(next.actions[0]).toBe('Raise the extraction 1.0 points: grind finer, lengthen the contact time, or brew a little hotter; one step at a time.')
    expect(next.reasoning).toContain('no grind step sized')
  })

  it('sizes an espresso by the beverage at the same dose, or the dose for the same beverage', () => {
    // 18 g → 30 g at 10.8 %TDS is 18.0 % EY. For 9.0 %TDS at 18.0 %: 18.0 × 18 / 9.0 = 36.0 g, or
    // 30 × 9.0 / 18.0 = 15.0 g of coffee for the same 30 g.
    const espresso = { tdsPercent: 9, yieldPercent: 19, zone: { tdsPercent: { min: 8, max: 10 }, yieldPercent: { min: 17.5, max: 22 } } }
    const shot: AttemptFigures = { method: 'espresso', dose: 18, beverageMass: 30, waterMass: null, tdsPercent: 10.8, yieldPercent: 18, grindSetting: '2.4', waterTemperatureC: 93 }
    const next = suggestNextChange(shot, espresso, [])
    expect(next.extraction).toBeNull()
    expect(next.strength).toMatchObject({ position: 'high', waterMass: null })
    expect(next.strength!.beverageMass).toBeCloseTo(36, 10)
    expect(next.strength!.dose).toBeCloseTo(15, 10)
    expect(next.actions).toEqual(['For 9.00 %TDS at 18.0 % EY: stop the shot at 36.0 g from 18.0 g, or dose 15.0 g for 30.0 g.'])
  })

  it('leaves an attempt inside the zone alone', () => {
    expect(suggestNextChange(pour('22 clicks', 20.5, { tdsPercent: 1.31 }), target, history).actions).toEqual(['Keep it: strength and extraction are both inside the target zone.'])
  })

  it('refuses a history that does not agree, naming its spread', () => {
    const scattered = [pour('20 clicks', 19), pour('22 clicks', 21), pour('24 clicks', 19), pour('26 clicks', 21)]
    const next = suggestNextChange(pour('24 clicks', 19.5, { tdsPercent: 1.3 }), target, scattered)
    expect(next.extraction!.noStep).toMatch(/no clear link between grind and extraction \(r = 0\.45\)/)
  })

  it('steps at the grinder\'s resolution and says when the step leaves the history', () => {
    // Settings in tenths: EY = 20 + 2 × (2.4 − setting); 1.5 points short at 2.4 → 0.75 finer → 1.65,
    // at a step of 0.1 that is 8 steps (7.5 rounded half up): 1.6, below the 2.0–2.6 brewed at.
    const shots = ['2.0', '2.2', '2.4', '2.6'].map(setting => pour(setting, 20 + 2 * (2.4 - Number(setting))))
    const next = suggestNextChange(pour('2.4', 19, { tdsPercent: 1.3 }), target, shots)
    expect(next.extraction!.grind).toMatchObject({ from: 2.4, to: 1.6, decimals: 1, beyondHistory: true })
    expect(next.actions[0]).toContain('from 2.4 to 1.6 (past the settings the team has brewed at')
  })
})

describe('similarBrews', () => {
  it('keeps the same method and grinder unit, a dose and ratio within 20 % and a temperature within 3 °C', () => {
    const attempt = pour('24 clicks', 19.5)
    const others = [
      pour('22 clicks', 20, { method: 'immersion' }),
      pour('22', 20),
      pour('22 clicks', 20, { dose: 20 }),
      pour('22 clicks', 20, { waterTemperatureC: 88 }),
      pour('22 clicks', 20, { tdsPercent: 2 }),
      pour('21 clicks', 20, { dose: 17 }),
    ]
    expect(similarBrews(attempt, others).map(brew => brew.grindSetting)).toEqual(['21 clicks'])
  })
})

describe('readGrindSetting', () => {
  it.each([['22 clicks', 22, 'clicks', 0], ['2,4', 2.4, '', 1], [' 3.25 Turns', 3.25, 'turns', 2]])('reads %s', (text, value, unit, decimals) => {
    expect(readGrindSetting(text)).toEqual({ value, unit, decimals })
  })

  it('reads none from a word', () => {
    expect(readGrindSetting('cupping')).toBeNull()
  })
})
