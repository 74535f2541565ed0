import type { ContextRecords } from '../../src/composables/brewContexts'
import type { LocalRecord } from '../../src/db/database'
import { describe, expect, it } from 'vitest'
import { defineZone, findZonePreset } from '../../shared/brewing'
import { contextLabel, judgedZone, teamDefault } from '../../src/composables/brewContexts'
import { localRecord } from './records'

const houseZone = defineZone({ id: 'zone-house', name: 'House strong', tdsPercent: { min: 1.35, max: 1.6 }, yieldPercent: { min: 19, max: 22 } })
const event = localRecord('event', { id: 'event-1', name: 'Breakwater Brewers Cup', zoneId: 'european-drip' })
const round = localRecord('round', { id: 'round-1', eventId: event.id, name: 'Heat 2', position: 2 })
const cup = localRecord('entry', { id: 'cup-1', roundId: round.id, code: 'TQ7' })
const map = <T extends { id: string }>(...rows: T[]): Map<string, T> => new Map(rows.map(row => [row.id, row]))

function records(defaults: LocalRecord<'zoneDefault'>[] = []): ContextRecords {
  return {
    entries: map(cup),
    rounds: map(round),
    events: map(event),
    lots: map(localRecord('lot', { id: 'lot-1', farm: 'Alder Ridge Estate' })),
    recipes: map(localRecord('recipe', { id: 'recipe-1', name: 'House filter' })),
    zones: id => findZonePreset(id) ?? (id === houseZone.id ? houseZone : undefined),
    defaults,
  }
}

describe('judgedZone', () => {
  it('judges a cup against its event\'s zone, whatever the phone shows', () => {
    expect(judgedZone({ kind: 'entry', refId: cup.id }, 'percolation', records())).toEqual({ zone: findZonePreset('european-drip'), source: 'the event\'s zone' })
  })

  it('judges a cup against its round\'s own zone when the round sets one, on every phone', () => {
    const own = localRecord('round', { id: 'round-2', eventId: event.id, name: 'Final', position: 3, zoneId: houseZone.id })
    const finalist = localRecord('entry', { id: 'cup-2', roundId: own.id, code: 'KX4M' })
    const found = { ...records(), rounds: map(round, own), entries: map(cup, finalist) }
    expect(judgedZone({ kind: 'entry', refId: finalist.id }, 'percolation', found)).toEqual({ zone: houseZone, source: 'the round\'s zone' })
    // The other round of the same event keeps the event's zone.
    expect(judgedZone({ kind: 'entry', refId: cup.id }, 'percolation', found).zone.id).toBe('european-drip')
  })

  it('judges a quick brew against the team\'s latest default for its family, else the preset', () => {
    expect(judgedZone({ kind: 'quick', refId: null }, 'percolation', records()).zone.id).toBe('us-drip')
    const defaults = [localRecord('zoneDefault', { family: 'filter', zoneId: 'nordic-drip' }), localRecord('zoneDefault', { family: 'filter', zoneId: houseZone.id })]
    expect(judgedZone({ kind: 'quick', refId: null }, 'percolation', records(defaults))).toEqual({ zone: houseZone, source: 'the team\'s default' })
  })

  it('never judges an espresso against a drip zone', () => {
    const defaults = [localRecord('zoneDefault', { family: 'espresso', zoneId: 'us-drip' })]
    expect(judgedZone({ kind: 'entry', refId: cup.id }, 'espresso', records(defaults)).zone.id).toBe('espresso')
    expect(teamDefault('espresso', records(defaults)).id).toBe('espresso')
  })
})

describe('contextLabel', () => {
  it.each([
    [{ kind: 'entry', refId: 'cup-1' }, 'Cup TQ7 · Heat 2'],
    [{ kind: 'lot', refId: 'lot-1' }, 'Lot: Alder Ridge Estate'],
    [{ kind: 'recipe', refId: 'recipe-1' }, 'Recipe: House filter'],
    [{ kind: 'quick', refId: null }, 'Quick brew'],
    [{ kind: 'lot', refId: 'lot-gone' }, 'A lot not on this phone'],
  ] as const)('names %o as %s', (context, label) => {
    expect(contextLabel(context, records())).toBe(label)
  })
})
