import type { LocalRecord } from '../../src/db/database'
import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { findZonePreset } from '../../shared/brewing'
import { inZone, ledgerRows } from '../../src/composables/useLedger'

const us = findZonePreset('us-drip')!
function brew(extra: Partial<LocalRecord>): LocalRecord {
  return {
    id: 'b1',
    teamId: 't',
    createdBy: 'u',
    createdAt: '2026-12-01T08:00:00.000Z',
    updatedAt: '2026-12-01T08:00:00.000Z',
    rev: 3,
    deletedAt: null,
    sync: { state: 'clean', baseRev: 3 },
    method: 'percolation',
    brewedAt: '2026-12-01T08:00:00.000Z',
    doseGross: 27.5,
    doseTare: 12.5,
    beverageGross: 652.6,
    beverageTare: 412.6,
    notes: 'bloom 40 s, "washed" lot',
    derived: { tdsPercent: 1.35, yieldPercent: 21.6 },
    ...extra,
  }
}

describe('ledgerRows', () => {
  it('puts units in the headers and the figures at display precision', () => {
    const [row] = ledgerRows([brew({})], us)
    expect(row).toMatchObject({ 'TDS (%)': '1.35', 'extraction yield (%)': '21.6', 'dose (g)': 15, 'beverage (g)': 240, 'in zone (US drip standard)': 'yes', 'synced': 'yes' })
  })

  it('survives a CSV round trip with quotes and commas in the notes (papaparse)', () => {
    const csv = Papa.unparse(ledgerRows([brew({}), brew({ id: 'b2', derived: null, sync: { state: 'pending', baseRev: null } })], us))
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true }).data
    expect(parsed[0]!.notes).toBe('bloom 40 s, "washed" lot')
    expect(parsed[1]).toMatchObject({ 'TDS (%)': '', 'in zone (US drip standard)': '', 'synced': 'no' })
  })
})

describe('inZone', () => {
  it('is unknown until the brew has figures', () => {
    expect(inZone(brew({ derived: null }), us)).toBeNull()
    expect(inZone(brew({ derived: { tdsPercent: 1.5, yieldPercent: 20 } }), us)).toBe(false)
  })
})
