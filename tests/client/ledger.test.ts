import type { LocalRecord } from '../../src/db/database'
import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { findZonePreset } from '../../shared/brewing'
import { filterBrews, inZone, ledgerRows, noFilters } from '../../src/composables/useLedger'
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
    const [row] = ledgerRows([brew({})], () => us)
    // 240 g of beverage from 15 g: 16.0 g per gram, the brew ratio the Bench and the chart show.
    expect(row).toMatchObject({ 'TDS (%)': '1.35', 'extraction yield (%)': '21.6', 'dose (g)': 15, 'beverage (g)': 240, 'brew ratio (g of beverage per g of coffee)': 16, 'zone': 'US drip standard', 'in zone': 'yes', 'synced': 'yes' })
  })

  it('survives a CSV round trip with quotes and commas in the notes (papaparse)', () => {
    const csv = Papa.unparse(ledgerRows([brew({}), brew({ id: 'b2', derived: null, sync: { state: 'pending', baseRev: null } })], () => us))
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true }).data
    expect(parsed[0]!.notes).toBe('bloom 40 s, "washed" lot')
    expect(parsed[1]).toMatchObject({ 'TDS (%)': '', 'in zone': '', 'synced': 'no' })
  })

  it('never takes an espresso\'s ratio from water it does not use', () => {
    // 36 g from 18 g is 2.0 g per gram; the 250 g of water on the record plays no part.
    const [row] = ledgerRows([brew({ method: 'espresso', dose: 18, beverageGross: null, beverageTare: null, beverageMass: 36, waterMass: 250, derived: { tdsPercent: 10, yieldPercent: 20 } })], () => us)
    expect(row!['brew ratio (g of beverage per g of coffee)']).toBe(2)
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

  it('judges each brew against the zone of its own family', () => {
    // 9.5 %TDS at 20 % is inside the espresso zone (8–12 %TDS, common practice), far outside a drip one.
    expect(ids({ zone: 'in' })).toEqual(['quick', 'lot', 'shot'])
    expect(inZone(brews[2]!, us)).toBe(false)
  })
})
