import { describe, expect, it } from 'vitest'
import { brixToRefractiveIndex, icumsaSucroseNd20, refractiveIndexToBrix, tdsFromBrix, temperatureDrift, waterNd20, zeroCheck } from '../../shared/brewing'
import { readCsv } from './fixtures'

// ICUMSA 1974 sucrose refractive index table at 20 °C (tests/fixtures/icumsa-sucrose-nd20.csv).
const table = readCsv('icumsa-sucrose-nd20.csv').map(row => [row.brix!, row.nD!] as const)

describe('the built-in sucrose table', () => {
  it('is the ICUMSA table, row for row', () => {
    expect(icumsaSucroseNd20).toEqual(table)
  })
})

describe('brixToRefractiveIndex and refractiveIndexToBrix', () => {
  it.each(table)('%f °Brix is nD %f (ICUMSA table row)', (brix, nD) => {
    expect(brixToRefractiveIndex(brix)).toBeCloseTo(nD, 10)
    expect(refractiveIndexToBrix(nD)).toBeCloseTo(brix, 10)
  })

  it('interpolates linearly between rows, as the table\'s users do', () => {
    // Halfway between the 12 and 13 °Brix rows (1.35093, 1.35250).
    expect(brixToRefractiveIndex(12.5)).toBeCloseTo(1.351715, 10)
    expect(refractiveIndexToBrix(1.351715)).toBeCloseTo(12.5, 10)
  })

  it('round-trips any value inside the table', () => {
    for (let brix = 0; brix <= 30; brix += 0.37)
      expect(refractiveIndexToBrix(brixToRefractiveIndex(brix))).toBeCloseTo(brix, 9)
  })

  it('gives pure water at 20 °C as nD 1.33299 (ICUMSA row 0; CRC Handbook 1.3330)', () => {
    expect(brixToRefractiveIndex(0)).toBe(waterNd20)
    expect(waterNd20).toBeCloseTo(1.333, 3)
  })

  it.each([-0.1, 30.01, 45])('refuses %f °Brix, outside the table', (brix) => {
    expect(() => brixToRefractiveIndex(brix)).toThrow(expect.objectContaining({ field: 'brix' }))
  })

  it.each([1.3329, 1.3812, 1.5])('refuses nD %f, outside the table', (nD) => {
    expect(() => refractiveIndexToBrix(nD)).toThrow(expect.objectContaining({ field: 'refractiveIndex' }))
  })
})

describe('tdsFromBrix', () => {
  it('uses 0.85 %TDS per °Brix by default (common practice)', () => {
    expect(tdsFromBrix(1.6)).toBeCloseTo(1.36, 10)
  })

  it('takes the factor the user trusts instead', () => {
    // Regressions for coffee give 0.849 ± 0.004 (common practice; see the handbook's reference table).
    expect(tdsFromBrix(10, 0.849)).toBeCloseTo(8.49, 10)
  })
})

describe('zeroCheck', () => {
  it('passes distilled water that reads nD 1.33299 at 20 °C', () => {
    expect(zeroCheck(1.33299, 'nD')).toMatchObject({ passed: true, expected: 1.33299 })
  })

  it('fails a reading 0.1 °Brix-equivalent off and says what to do', () => {
    // 0.1 °Brix is about 0.00014 nD near zero (ICUMSA rows 0 and 1 differ by 0.00143).
    const result = zeroCheck(1.33320, 'nD')
    expect(result.passed).toBe(false)
    expect(result.deviation).toBeCloseTo(0.00021, 8)
    expect(result.message).toContain('zero the instrument')
  })

  it('checks °Brix and %TDS instruments against zero', () => {
    // OIV-MA-AS2-02 reads sugar to 0.1 %; the %TDS tolerance is common practice.
    expect(zeroCheck(0.1, 'brix').passed).toBe(true)
    expect(zeroCheck(0.2, 'brix').passed).toBe(false)
    expect(zeroCheck(-0.02, 'tds').passed).toBe(true)
    expect(zeroCheck(0.05, 'tds').passed).toBe(false)
  })

  it('takes a tolerance of the user\'s own', () => {
    expect(zeroCheck(0.05, 'tds', 0.06).passed).toBe(true)
  })
})

describe('temperatureDrift', () => {
  it('puts water at 25 °C about 0.0005 nD below 20 °C', () => {
    // IAPWS 1997 release on the refractive index of water: about −1.0 × 10⁻⁴ per °C near 20–25 °C;
    // ISO 1743's water row averages −1.05 × 10⁻⁴ over 20–30 °C.
    expect(temperatureDrift(25).offsetNd).toBeCloseTo(-0.0005, 6)
    // Within 10 % of the ISO average.
    expect(Math.abs(temperatureDrift(30).offsetNd / 10 + 1.05e-4)).toBeLessThanOrEqual(0.105e-4)
  })

  it('matters only more than 1 °C from 20 °C', () => {
    expect(temperatureDrift(20.8).significant).toBe(false)
    expect(temperatureDrift(18.5)).toMatchObject({ significant: true, offsetNd: expect.closeTo(0.00015, 8) })
  })

  it('refuses a temperature no sample has, naming the field', () => {
    expect(() => temperatureDrift(80)).toThrow(expect.objectContaining({ field: 'temperatureC' }))
  })
})
