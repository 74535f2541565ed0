import type { ContextRecords } from '../../src/composables/brewContexts'
import type { LocalRecord } from '../../src/db/database'
import { describe, expect, it } from 'vitest'
import { cuppingZone, defineZone, findZonePreset } from '../../shared/brewing'
import { contextLabel, judgedZone, teamDefault } from '../../src/composables/brewContexts'
import { dayOf } from '../../src/forms/format'
import { localRecord } from './records'

const houseZone = defineZone({ id: 'zone-house', name: 'House strong', tdsPercent: { min: 1.35, max: 1.6 }, yieldPercent: { min: 19, max: 22 } })
const event = localRecord('event', { id: 'event-1', name: 'Breakwater Brewers Cup', zoneId: 'european-drip' })
const round = localRecord('round', { id: 'round-1', eventId: event.id, name: 'Heat 2', position: 2 })
const cup = localRecord('entry', { id: 'cup-1', roundId: round.id, code: 'TQ7' })
const map = <T extends { id: string }>(...rows: T[]): Map<string, T> => new Map(rows.map(row => [row.id, row]))
const filterSettings = { name: 'House filter', method: 'percolation', dose: 15, waterMass: 250, targetTdsPercent: 1.3, targetYieldPercent: 20.5, grindSetting: '22 clicks', contactTimeSeconds: 210, waterTemperatureC: 94, notes: '', beverageMass: null, retainedRatio: null, timeToleranceSeconds: null, zoneId: 'nordic-drip', retired: false } as const
// Version 2 moved the recipe to the team's own zone and renamed it; version 1 brews keep theirs.
const v1 = localRecord('recipeVersion', { id: 'version-1', recipeId: 'recipe-1', number: 1, reason: 'First version', settings: filterSettings })
const v2 = localRecord('recipeVersion', { id: 'version-2', recipeId: 'recipe-1', number: 2, basedOnId: v1.id, reason: 'Adopted attempt 3', settings: { ...filterSettings, name: 'Quay filter', zoneId: houseZone.id } })
const stall = localRecord('dialIn', { id: 'session-1', method: 'percolation', place: 'Saltmarsh Night Market', zoneId: 'european-drip', startedAt: '2026-12-01T16:00:00.000Z' })

function records(defaults: LocalRecord<'zoneDefault'>[] = []): ContextRecords {
  return {
    entries: map(cup),
    rounds: map(round),
    events: map(event),
    lots: map(localRecord('lot', { id: 'lot-1', farm: 'Alder Ridge Estate' })),
    recipes: map(localRecord('recipe', { id: 'recipe-1', ...v2.settings, versionId: v2.id }), localRecord('recipe', { id: 'recipe-old', name: 'Old filter' })),
    zones: id => findZonePreset(id) ?? (id === houseZone.id ? houseZone : undefined),
    defaults,
    tables: map(localRecord('cuppingTable', { id: 'table-1', heldOn: '2026-11-28', place: 'Hollin Step mill', lotIds: ['lot-1'] })),
    recipeVersions: map(v1, v2),
    dialIns: map(stall),
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

  it('judges every bowl of a lot against the cupping zone, whatever the team\'s default', () => {
    const defaults = [localRecord('zoneDefault', { family: 'filter', zoneId: 'nordic-drip' })]
    expect(judgedZone({ kind: 'lot', refId: 'lot-1', tableId: 'table-1' }, 'immersion', records(defaults))).toEqual({ zone: cuppingZone, source: 'the zone for cupping bowls' })
    expect(judgedZone({ kind: 'lot', refId: 'lot-1' }, 'immersion', records(defaults)).zone).toBe(cuppingZone)
  })

  it('judges a recipe brew against the zone of the version it followed, and says so', () => {
    expect(judgedZone({ kind: 'recipe', refId: 'recipe-1', versionId: v1.id }, 'percolation', records())).toEqual({ zone: findZonePreset('nordic-drip'), source: 'the recipe\'s zone' })
    expect(judgedZone({ kind: 'recipe', refId: 'recipe-1', versionId: v2.id }, 'percolation', records())).toEqual({ zone: houseZone, source: 'the recipe\'s zone' })
    // A brew that names no version follows the recipe as it stands.
    expect(judgedZone({ kind: 'recipe', refId: 'recipe-1' }, 'percolation', records()).zone).toEqual(houseZone)
    // A recipe with no zone of its own leaves its brews to the team's default.
    expect(judgedZone({ kind: 'recipe', refId: 'recipe-old' }, 'percolation', records())).toEqual({ zone: findZonePreset('us-drip'), source: 'the team\'s default' })
  })

  it('judges a blank dial-in attempt against its session\'s zone', () => {
    expect(judgedZone({ kind: 'quick', refId: null, sessionId: stall.id }, 'percolation', records())).toEqual({ zone: findZonePreset('european-drip'), source: 'the dial-in\'s zone' })
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
    [{ kind: 'recipe', refId: 'recipe-1' }, 'Recipe: Quay filter'],
    [{ kind: 'recipe', refId: 'recipe-1', versionId: 'version-1' }, 'Recipe: House filter v1'],
    [{ kind: 'recipe', refId: 'recipe-1', versionId: 'version-2', sessionId: 'session-1' }, 'Recipe: Quay filter v2 · dial-in at Saltmarsh Night Market'],
    [{ kind: 'quick', refId: null, sessionId: 'session-1' }, 'Blank dial-in at Saltmarsh Night Market'],
    [{ kind: 'quick', refId: null }, 'Quick brew'],
    [{ kind: 'lot', refId: 'lot-gone' }, 'A lot not on this phone'],
    [{ kind: 'lot', refId: 'lot-1', tableId: 'table-gone' }, 'Lot: Alder Ridge Estate'],
  ] as const)('names %o as %s', (context, label) => {
    expect(contextLabel(context, records())).toBe(label)
  })
})

describe('contextLabel of a bowl on a cupping table', () => {
  it('names the lot and the table\'s day in the phone\'s locale', () => {
    expect(contextLabel({ kind: 'lot', refId: 'lot-1', tableId: 'table-1' }, records())).toBe(`Lot: Alder Ridge Estate · table of ${dayOf('2026-11-28T12:00:00')}`)
  })
})
