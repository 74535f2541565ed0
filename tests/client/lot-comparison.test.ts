import { describe, expect, it } from 'vitest'
import { defaultScoreSheet, immersionYield } from '../../shared/brewing'
import { scoreIdOf } from '../../shared/records/rules'
import { compareLots, comparisonCsvRows, sortLots } from '../../src/forms/lotComparison'
import { localRecord } from './records'

const tripId = 'trip-1'
const lots = [
  localRecord('lot', { id: 'lot-a', tripId, farm: 'Alder Ridge Estate', moisturePercent: 10.8, askingPrice: 7.4, currency: 'EUR', priceUnit: 'kg', decision: 'claim', decisionReason: 'Clean and sweet', primaryDefects: 0, secondaryDefects: 2, defectSampleG: 350 }),
  localRecord('lot', { id: 'lot-b', tripId, farm: 'Copperbeck Farm', moisturePercent: 11.4, askingPrice: 3.5, currency: 'EUR', priceUnit: 'lb', decision: 'open', primaryDefects: 1, secondaryDefects: 3, defectSampleG: 300 }),
  localRecord('lot', { id: 'lot-c', tripId, farm: 'Brackenfold', moisturePercent: null, askingPrice: null, decision: 'pass' }),
]
const table = localRecord('cuppingTable', { id: 'table-1', tripId, heldOn: '2026-11-28', lotIds: ['lot-a', 'lot-b'] })
let minute = 0
function bowl(lotId: string, tdsPercent: number) {
  minute += 1
  const yieldPercent = immersionYield({ tdsPercent, waterMass: 150, dose: 8.25 })
  return localRecord('brew', { id: `bowl-${minute}`, context: { kind: 'lot', refId: lotId, tableId: table.id }, method: 'immersion', brewedAt: `2026-11-28T10:${String(minute).padStart(2, '0')}:00.000Z`, derived: { tdsPercent, yieldPercent } })
}
const values = (overall: number) => defaultScoreSheet.attributes.map(a => ({ attribute: a.key, value: a.step ? 10 : a.key === 'overall' ? overall : 7.75 }))
const score = (lotId: string, taster: string, overall: number) => localRecord('score', { id: scoreIdOf(table.id, lotId, taster), createdBy: taster, tableId: table.id, lotId, values: values(overall), deduction: 0 })

const rows = compareLots({
  lots,
  tables: [table],
  bowls: [bowl('lot-a', 1.12), bowl('lot-a', 1.13), bowl('lot-a', 1.11), bowl('lot-b', 1.2), bowl('lot-b', 1.21), bowl('lot-b', 1.34)],
  // 6 × 7.75 + 30 + overall: 84.5 and 85.5 for Alder Ridge, 83.5 for Copperbeck.
  scores: [score('lot-a', 'u1', 8), score('lot-a', 'u2', 9), score('lot-b', 'u1', 7)],
  photos: [localRecord('photo', { id: 'p1', subject: 'lot', lotId: 'lot-a', contentType: 'image/jpeg', sizeBytes: 1000, takenAt: '2026-11-28T10:00:00.000Z' })],
  sheetOf: () => defaultScoreSheet,
})

describe('compareLots', () => {
  it('gives each lot its table mean score, its bowls and its grading side by side', () => {
    const [alder, copperbeck, bracken] = rows
    expect(alder).toMatchObject({ score: 85, tasters: 2, photos: 1, bowlsOn: '2026-11-28', pricePerKg: 7.4, defects: { primary: 0, secondary: 2 } })
    expect(alder!.bowls).toMatchObject({ n: 3, uniform: true })
    expect(alder!.bowls!.meanTdsPercent).toBeCloseTo(1.12, 12)
    expect(copperbeck!.score).toBe(83.5)
    // 1.34 sits apart, but three bowls need Q > 0.970 (Rorabacher 1991): Q = 0.13 / 0.14 = 0.93 keeps it.
    expect(copperbeck!.bowls!.uniform).toBe(true)
    // 3.50 EUR per lb is 3.50 / 0.45359237 EUR per kg; 1 and 3 defects in 300 g are 7/6 and 3.5 per 350 g.
    expect(copperbeck!.pricePerKg).toBeCloseTo(7.716, 3)
    expect(copperbeck!.defects!.primary).toBeCloseTo(350 / 300, 12)
    expect(bracken).toMatchObject({ score: null, bowls: null, pricePerKg: null, defects: null })
  })

  it('sorts by a column either way, lots without a value last', () => {
    expect(sortLots(rows, 'score', 'descending').map(r => r.lot.farm)).toEqual(['Alder Ridge Estate', 'Copperbeck Farm', 'Brackenfold'])
    expect(sortLots(rows, 'score', 'ascending').map(r => r.lot.farm)).toEqual(['Copperbeck Farm', 'Alder Ridge Estate', 'Brackenfold'])
    expect(sortLots(rows, 'price', 'ascending').map(r => r.lot.farm)).toEqual(['Alder Ridge Estate', 'Copperbeck Farm', 'Brackenfold'])
    expect(sortLots(rows, 'decision', 'ascending').map(r => r.lot.decision)).toEqual(['claim', 'open', 'pass'])
    expect(sortLots(rows, 'farm', 'ascending').map(r => r.lot.farm)).toEqual(['Alder Ridge Estate', 'Brackenfold', 'Copperbeck Farm'])
  })
})

describe('comparisonCsvRows', () => {
  it('writes figures at their display precision with units in the headers', () => {
    const [alder, copperbeck] = comparisonCsvRows(rows)
    expect(alder).toMatchObject({ 'lot': 'Alder Ridge Estate', 'score (table mean)': '85.00', 'mean TDS (%)': '1.12', 'bowls': 3, 'bowls alike': 'yes', 'decision': 'Claim', 'reason': 'Clean and sweet', 'price per': 'per kg', 'moisture (%)': 10.8 })
    expect(copperbeck).toMatchObject({ 'price per kg': '7.72', 'price per': 'per lb', 'decision': 'Open' })
  })
})
