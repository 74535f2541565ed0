import { describe, expect, it } from 'vitest'
import { BrewingInputError, checkScore, defaultScoreSheet, lotScores, scoreTotal } from '../../shared/brewing'

const sheet = defaultScoreSheet
// Six attributes at 7.75, three cup counts at 10, overall 8.00: 6 × 7.75 + 30 + 8 = 84.5.
const full = sheet.attributes.map(attribute => ({ attribute: attribute.key, value: attribute.step ? 10 : attribute.key === 'overall' ? 8 : 7.75 }))

describe('defaultScoreSheet', () => {
  it('holds the ten attributes the trade cups by, summed to at most 100', () => {
    // The SCA cupping form's attribute set (from memory): ten attributes of at most 10 points each.
    expect(sheet.attributes).toHaveLength(10)
    expect(sheet.attributes.reduce((sum, attribute) => sum + (attribute.scaleMax ?? sheet.scaleMax), 0)).toBe(100)
    expect(sheet.total).toBe('sum')
  })
})

describe('scoreTotal', () => {
  it('sums every attribute and takes off the points for defects', () => {
    expect(scoreTotal(sheet, full)).toEqual({ total: 84.5, missing: [] })
    // A taint in one cup of five: 2 points off (SCA form, taint intensity 2 × cups; from memory).
    expect(scoreTotal(sheet, full, 2).total).toBe(82.5)
  })

  it('waits for every attribute before it gives a total', () => {
    expect(scoreTotal(sheet, full.slice(1))).toEqual({ total: null, missing: ['fragrance-aroma'] })
  })

  it('gives the mean on a sheet that averages', () => {
    const short = { ...sheet, attributes: sheet.attributes.slice(0, 2), total: 'mean' as const }
    expect(scoreTotal(short, [{ attribute: 'fragrance-aroma', value: 7.5 }, { attribute: 'flavour', value: 8 }]).total).toBe(7.75)
  })

  it.each([
    [{ attribute: 'flavour', value: 5.75 }, 'values.flavour', /from 6 to 10/],
    [{ attribute: 'flavour', value: 8.3 }, 'values.flavour', /steps of 0.25/],
    [{ attribute: 'uniformity', value: 9 }, 'values.uniformity', /steps of 2/],
  ])('refuses %o, naming %s', (bad, field, message) => {
    const values = full.map(entry => (entry.attribute === bad.attribute ? bad : entry))
    expect(() => scoreTotal(sheet, values)).toThrow(message)
    try {
      scoreTotal(sheet, values)
    }
    catch (error) {
      expect(error).toBeInstanceOf(BrewingInputError)
      expect((error as BrewingInputError).field).toBe(field)
    }
  })

  it('accepts a score on the step of its own scale', () => {
    expect(checkScore(sheet, sheet.attributes[0]!, 8.25)).toBe(8.25)
  })
})

describe('lotScores', () => {
  it('averages the tasters\' complete totals, and each attribute over those who scored it', () => {
    const second = full.map(entry => (entry.attribute === 'overall' ? { ...entry, value: 9 } : entry))
    const result = lotScores(sheet, [{ values: full, deduction: 0 }, { values: second, deduction: 2 }, { values: full.slice(2), deduction: 0 }])
    expect(result.tasters).toBe(2)
    // (84.5 + 83.5) / 2: the incomplete sheet stays out of the mean total.
    expect(result.meanTotal).toBe(84)
    expect(result.attributeMeans.get('overall')).toBeCloseTo((8 + 9 + 8) / 3, 12)
    expect(result.attributeMeans.get('fragrance-aroma')).toBe(7.75)
  })

  it('has no mean before a complete score', () => {
    expect(lotScores(sheet, []).meanTotal).toBeNull()
  })
})
