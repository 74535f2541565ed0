import type { LedgerFilters } from '../../src/composables/useLedger'
import type { LocalRecord } from '../../src/db/database'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { findZonePreset } from '../../shared/brewing'
import { filterBrews, noFilters } from '../../src/composables/useLedger'
import { db } from '../../src/db/database'
import { countBrews, ledgerIds } from '../../src/db/ledgerQueries'
import { localRecord } from './records'

// The Ledger's index reads against the plain filter over every brew, on a mixed team: methods,
// kinds of context, brews across a month, deleted ones, another team's.
const us = findZonePreset('us-drip')!
const now = Date.parse('2026-12-02T15:00:00.000Z')
const methods = ['percolation', 'immersion', 'espresso'] as const
const brews: LocalRecord<'brew'>[] = Array.from({ length: 240 }, (_, i) => ({ ...localRecord('brew', {
  id: `b${String(i).padStart(4, '0')}`,
  context: i % 5 === 0 ? { kind: 'recipe', refId: `r${i % 3}` } : { kind: 'quick', refId: null },
  method: methods[i % 3]!,
  strengthSource: 'direct',
  brewedAt: new Date(now - i * 3 * 3_600_000).toISOString(),
  notes: i % 7 === 0 ? 'washed lot, bright' : '',
  grindSetting: '',
  derived: { tdsPercent: 1.1 + (i % 6) / 10, yieldPercent: 17 + (i % 7) },
}), teamId: i % 17 === 0 ? 'other' : 't', deletedAt: i % 11 === 0 ? '2026-12-01T00:00:00.000Z' : null }))

beforeAll(async () => {
  await db.brews.bulkPut(brews)
})
afterAll(async () => {
  await db.brews.clear()
})

const expected = (filters: LedgerFilters): string[] => filterBrews(brews.filter(b => b.teamId === 't' && !b.deletedAt).sort((a, b) => b.brewedAt.localeCompare(a.brewedAt)), filters, () => us, now).map(b => b.id)

describe('ledgerIds', () => {
  it.each<[string, Partial<LedgerFilters>]>([
    ['no filter', {}],
    ['a method', { method: 'immersion' }],
    ['a kind of context', { context: 'recipe' }],
    ['a method and a kind of context', { method: 'percolation', context: 'recipe' }],
    ['the last 7 days', { period: 'week' }],
    ['today', { period: 'today' }],
    ['a range of dates', { period: 'dates', from: '2026-11-20', to: '2026-11-25' }],
    ['in the zone', { zone: 'in' }],
    ['words in the notes, with a method', { search: 'washed', method: 'espresso' }],
  ])('keeps what the filter over every brew keeps, newest first: %s', async (_name, filters) => {
    const f = { ...noFilters, ...filters }
    const ids = await ledgerIds('t', f, () => us, now)
    expect(ids).toEqual(expected(f))
    expect(ids.length).toBeGreaterThan(0)
  })

  it('counts the team\'s brews without the deleted ones or another team\'s', async () => {
    expect(await countBrews('t')).toBe(brews.filter(b => b.teamId === 't' && !b.deletedAt).length)
  })
})
