import { describe, expect, it } from 'vitest'
import { decimalsForResolution, formatMass, formatTds, formatYield, roundHalfUp, roundToResolution } from '../../shared/brewing'

describe('roundHalfUp', () => {
  // Half-up rounding on the decimal digits shown (common practice in laboratory reporting);
  // `Number.prototype.toFixed` gets these wrong because 1.005 is stored as 1.00499999…
  it.each([
    [1.005, 2, 1.01],
    [2.675, 2, 2.68],
    [1.345, 2, 1.35],
    [21.65, 1, 21.7],
    [20.25, 1, 20.3],
    [0.125, 2, 0.13],
    [1.004999, 2, 1],
    [-1.005, 2, -1.01],
    [123.456, 0, 123],
    [1e-7, 3, 0],
    [5e-7, 6, 0.000001],
  ])('rounds %f to %i decimals as %f', (value, decimals, expected) => {
    expect(roundHalfUp(value, decimals)).toBe(expected)
  })

  it('stays finite for numbers printed in exponent form', () => {
    expect(roundHalfUp(1.5e22, 2)).toBe(1.5e22)
    expect(roundHalfUp(-2.5e-9, 9)).toBe(-3e-9)
  })

  it('formats 1.005 %TDS as 1.01, where toFixed gives 1.00', () => {
    expect(formatTds(1.005)).toBe('1.01')
  })
})

describe('display precision', () => {
  it('shows strength to 2 decimals and extraction to 1', () => {
    expect(formatTds(1.3449)).toBe('1.34')
    expect(formatTds(1.345)).toBe('1.35')
    expect(formatYield(21.6)).toBe('21.6')
    expect(formatYield(19.95)).toBe('20.0')
  })

  it('shows masses at the scale\'s resolution', () => {
    expect(decimalsForResolution(0.1)).toBe(1)
    expect(decimalsForResolution(0.01)).toBe(2)
    expect(decimalsForResolution(1)).toBe(0)
    expect(decimalsForResolution(0.05)).toBe(2)
    expect(formatMass(36.04, 0.1)).toBe('36.0')
    expect(formatMass(36.05, 0.1)).toBe('36.1')
    expect(formatMass(18.004, 0.01)).toBe('18.00')
    expect(formatMass(240.26, 0.5)).toBe('240.5')
    expect(roundToResolution(17.74, 0.5)).toBe(17.5)
  })
})
