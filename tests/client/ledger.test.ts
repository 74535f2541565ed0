import type { LocalRecord } from '../../src/db/database'
import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { findZonePreset } from '../../shared/brewing'
import { filterBrews, inZone, noFilters } from '../../src/composables/useLedger'
import { ledgerRows, readingRows } from '../../src/forms/ledgerExport'
import { localRecord } from './records'

const us = findZonePreset('us-drip')!
function brew(extra: Partial<LocalRecord<'brew'>>): LocalRecord<'brew'> {
  return localRecord('brew', {
    id: 'b1',
    rev: 3,
    sync: { state: 'clean', baseRev: 3 },
    context: { kind: 'quick', refId: null },
    strengthSource: 'direct',
    method: 'percolation',
    brewedAt: '2026-12-01T08:00:00.000Z',
    doseGross: 27.5,
    doseTare: 12.5,
    beverageGross: 652.6,
    beverageTare: 412.6,
    notes: 'bloom 40 s, "washed" lot',
    derived: { tdsPercent: 1.35, yieldPercent: 21.6 },
    ...extra,
  })
}

describe('ledgerRows', () => {
  it('puts units in the headers and the figures at display precision', () => {
    const [row] = ledgerRows([brew({})], { zoneFor: () => us })
    // 240 g of beverage from 15 g: 16.0 g per gram, the brew ratio the Bench and the chart show.
    expect(row).toMatchObject({ 'TDS (%)': '1.35', 'extraction yield (%)': '21.6', 'dose (g)': 15, 'beverage (g)': 240, 'brew ratio (g of beverage per g of coffee)': 16, 'zone': 'US drip standard', 'in zone': 'yes', 'synced': 'yes' })
  })

  it('survives a CSV round trip with quotes and commas in the notes (papaparse)', () => {
    const csv = Papa.unparse(ledgerRows([brew({}), brew({ id: 'b2', derived: null, sync: { state: 'pending', baseRev: null } })], { zoneFor: () => us }))
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true }).data
    expect(parsed[0]!.notes).toBe('bloom 40 s, "washed" lot')
    expect(parsed[1]).toMatchObject({ 'TDS (%)': '', 'in zone': '', 'synced': 'no' })
  })

  it('never takes an espresso\'s ratio from water it does not use', () => {
    // 36 g from 18 g is 2.0 g per gram; the 250 g of water on the record plays no part.
    const [row] = ledgerRows([brew({ method: 'espresso', dose: 18, beverageGross: null, beverageTare: null, beverageMass: 36, waterMass: 250, derived: { tdsPercent: 10, yieldPercent: 20 } })], { zoneFor: () => us })
    expect(row!['brew ratio (g of beverage per g of coffee)']).toBe(2)
  })
})

describe('the export of a disputed brew', () => {
  const pen = localRecord('instrument', { id: 'pen', label: 'Bar pen', readingKind: 'tds', resolution: 0.01 })
  const line = localRecord('calibration', { id: 'cal', instrumentId: 'pen', standardUnit: 'tds', calibratedAt: '2026-11-30T07:00:00.000Z', points: [{ concentration: 0, reading: 0 }, { concentration: 1.4, reading: 1.38 }] })
  const readings = [1.3, 1.32, 1.6].map((value, i) => localRecord('reading', { id: `r${i}`, brewId: 'b1', value, kind: 'tds', takenAt: `2026-12-01T08:0${i}:00.000Z` }))
  const disputed = brew({ instrumentId: 'pen', calibrationId: 'cal', excludedReadingIds: ['r2'] })
  const context = { zoneFor: () => us, readingsOf: () => readings, instrumentOf: () => pen, calibrationOf: () => line, nameOf: () => 'Mats Quillon', labelOf: () => 'Cup K7 · Final' }

  it('carries gross and tare, every reading at the instrument\'s step, the instrument and the calibration', () => {
    const [row] = ledgerRows([disputed], context)
    expect(row).toMatchObject({ 'dose gross (g)': 27.5, 'dose tare (g)': 12.5, 'beverage gross (g)': 652.6, 'beverage tare (g)': 412.6, 'readings': '1.30; 1.32', 'readings set aside': '1.60', 'reading unit': '%TDS', 'instrument': 'Bar pen', 'calibration fitted at (ISO 8601)': '2026-11-30T07:00:00.000Z', 'context': 'Cup K7 · Final', 'recorded by': 'Mats Quillon' })
  })

  it('has a file of readings, one row each, saying which were set aside', () => {
    const rows = readingRows([disputed], context)
    expect(rows.map(r => [r.reading, r.value, r['set aside']])).toEqual([[1, '1.30', 'no'], [2, '1.32', 'no'], [3, '1.60', 'yes']])
  })
})

describe('inZone', () => {
  it('is unknown until the brew has figures', () => {
    expect(inZone(brew({ derived: null }), us)).toBeNull()
    expect(inZone(brew({ derived: { tdsPercent: 1.5, yieldPercent: 20 } }), us)).toBe(false)
  })
})

describe('filterBrews', () => {
  const espresso = findZonePreset('espresso')!
  const zoneFor = (brew: LocalRecord<'brew'>) => (brew.method === 'espresso' ? espresso : us)
  const brews = [
    brew({ id: 'quick', brewedAt: '2026-12-01T08:00:00.000Z' }),
    brew({ id: 'lot', context: { kind: 'lot', refId: 'l1' }, method: 'immersion', brewedAt: '2026-11-20T08:00:00.000Z', grindSetting: 'cupping' }),
    brew({ id: 'shot', method: 'espresso', brewedAt: '2026-11-30T08:00:00.000Z', derived: { tdsPercent: 9.5, yieldPercent: 20 } }),
  ]
  const ids = (filters: Partial<typeof noFilters>, now = Date.parse('2026-12-01T12:00:00.000Z')) => filterBrews(brews, { ...noFilters, ...filters }, zoneFor, now).map(b => b.id)

  it('keeps every brew with no filters', () => {
    expect(ids({})).toEqual(['quick', 'lot', 'shot'])
  })

  it('filters by context, method and words in the notes or grind', () => {
    expect(ids({ context: 'lot' })).toEqual(['lot'])
    expect(ids({ method: 'espresso' })).toEqual(['shot'])
    expect(ids({ search: 'CUPPING' })).toEqual(['lot'])
  })

  it('keeps the chosen days, both ends included', () => {
    expect(ids({ period: 'dates', from: '2026-11-30', to: '2026-12-01' })).toEqual(['quick', 'shot'])
    expect(ids({ period: 'dates', to: '2026-11-25' })).toEqual(['lot'])
    expect(ids({ period: 'week' })).toEqual(['quick', 'shot'])
  })

  it('takes today as the phone\'s calendar day, not the last 24 hours', () => {
    const local = (time: string): string => new Date(time).toISOString()
    const night = [brew({ id: 'after-midnight', brewedAt: local('2026-12-01T00:30:00') }), brew({ id: 'before-midnight', brewedAt: local('2026-11-30T23:30:00') })]
    const kept = filterBrews(night, { ...noFilters, period: 'today' }, zoneFor, Date.parse(local('2026-12-01T10:00:00')))
    expect(kept.map(b => b.id)).toEqual(['after-midnight'])
  })

  it('judges each brew against the zone of its own family', () => {
    // 9.5 %TDS at 20 % is inside the espresso zone (8–12 %TDS, common practice), far outside a drip one.
    expect(ids({ zone: 'in' })).toEqual(['quick', 'lot', 'shot'])
    expect(inZone(brews[2]!, us)).toBe(false)
  })
})
