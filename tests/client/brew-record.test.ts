import type { BrewForm } from '../../src/composables/useBrewForm'
import { describe, expect, it } from 'vitest'
import { ref } from 'vue'
import { computeBrew, findZonePreset } from '../../shared/brewing'
import { brewInputOf } from '../../shared/records/brew-input'
import { entityDataSchemas } from '../../shared/schemas/entities'
import { emptyBrewForm, useBrewForm } from '../../src/composables/useBrewForm'
import { gaugeOf } from '../../src/composables/useGauges'
import { brewDataOf, formOfBrew, newReadingsOf } from '../../src/forms/brewRecord'
import { localRecord } from './records'

const readingIds = ['0190a8c4-0000-7000-8000-0000000000e1', '0190a8c4-0000-7000-8000-0000000000e2', '0190a8c4-0000-7000-8000-0000000000e3']
const pen = localRecord('instrument', { id: '0190a8c4-0000-7000-8000-00000000000a', label: 'Bar pen', readingKind: 'tds', resolution: 0.01, repeatability: 0.02, brixFactor: null })
const gauges = ref(new Map([[pen.id, gaugeOf(pen, null)]]))

/** A form as a person fills it, saved as the Bench saves it, read by the server's schema, and opened again to edit. */
function roundTrip(filled: Partial<BrewForm>) {
  const { form, outcome, gauge } = useBrewForm({ ...emptyBrewForm(), ...filled }, { gauges, judge: () => ({ zone: findZonePreset('us-drip')!, source: 'the team\'s default' }) })
  const brewedAt = '2026-12-02T07:30:00.000Z'
  // The server parses what the phone sends with the entity's schema; a stored brew is that.
  const stored = entityDataSchemas.brew.parse({ ...brewDataOf(form, outcome.value, gauge.value), brewedAt })
  const readings = newReadingsOf(form, outcome.value, gauge.value, brewedAt).map((reading, index) => ({ ...entityDataSchemas.reading.parse({ ...reading.data, brewId: pen.id }), id: readingIds[index]! }))
  return { form, outcome: outcome.value, stored, readings, again: formOfBrew(stored, readings) }
}

describe('a brew from the form to its record and back', () => {
  it.each<[string, Partial<BrewForm>]>([
    // Handbook worked pour-over: 27.5 − 12.5 = 15.0 g, 652.6 − 412.6 = 240.0 g, 1.35 %TDS → 21.6 %.
    ['a pour-over weighed as gross and tare', { byDifference: true, doseGross: '27.5', doseTare: '12.5', beverageGross: '652.6', beverageTare: '412.6', grindSetting: '22 clicks', contactTime: '3:25', waterTemperature: '94', notes: 'bloom 40 s' }],
    // Handbook worked espresso: 18.0 g → 36.0 g at 10.00 %TDS → 20.0 %.
    ['an espresso of net masses', { method: 'espresso', byDifference: false, dose: '18', beverageMass: '36', contactTime: '0:28' }],
    // Handbook worked full immersion: 180 g of water on 10 g, 1.20 %TDS → 21.86 %.
    ['a full immersion with its water', { method: 'immersion', byDifference: false, dose: '10', waterMass: '180', retainedRatio: '3.0' }],
    ['a percolation estimated from the water, with a decimal comma', { byDifference: false, dose: '15,5', waterMass: '250', retainedRatio: '2.1' }],
  ])('keeps %s as typed', (_what, filled) => {
    const values = filled.method === 'espresso' ? [10] : filled.method === 'immersion' ? [1.2] : [1.34, 1.35, 1.36]
    const { form, outcome, stored, readings, again } = roundTrip({ ...filled, instrumentId: pen.id, readings: values.map(value => ({ value, excluded: false })) })
    // The record gives the same result the form showed...
    expect(computeBrew(brewInputOf(stored, readings, null))).toEqual(outcome.result)
    // ...and opens again as the form it came from (a decimal comma comes back as a point), its
    // readings now stored with their ids.
    const typed = (f: BrewForm) => ({ ...f, dose: f.dose.replace(',', '.'), readings: f.readings.map(r => r.value) })
    expect(typed(again)).toEqual(typed(form))
    expect(again.readings.every(r => r.id)).toBe(true)
  })

  it('keeps a reading set aside on record and out of the result', () => {
    const { stored, readings } = roundTrip({ byDifference: false, dose: '15', beverageMass: '240', instrumentId: pen.id, readings: [{ value: 1.34, excluded: false }, { value: 1.35, excluded: false }, { value: 1.6, excluded: false }] })
    const edited = formOfBrew({ ...stored, excludedReadingIds: [readings[2]!.id] }, readings)
    expect(edited.readings.map(r => r.excluded)).toEqual([false, false, true])
    expect(computeBrew(brewInputOf({ ...stored, excludedReadingIds: [readings[2]!.id] }, readings, null)).tdsPercent).toBeCloseTo(1.345, 12)
  })

  it('keeps a cupping bowl on its table when it is edited', () => {
    const context = { kind: 'lot' as const, refId: '0190a8c4-0000-7000-8000-0000000000c1', tableId: '0190a8c4-0000-7000-8000-0000000000c2' }
    const { stored, readings, again } = roundTrip({ context, method: 'immersion', byDifference: false, dose: '8.25', waterMass: '150', instrumentId: pen.id, readings: [{ value: 1.12, excluded: false }] })
    expect(stored.context).toEqual(context)
    expect(formOfBrew(stored, readings).context).toEqual(context)
    expect(again.context.tableId).toBe(context.tableId)
  })

  it('stores no water for an espresso, whatever its hidden field held from a filter recipe', () => {
    const { stored } = roundTrip({ method: 'espresso', byDifference: false, dose: '18', beverageMass: '36', waterMass: '250', instrumentId: pen.id, readings: [{ value: 10, excluded: false }] })
    expect(stored.waterMass).toBeNull()
    // EY = 10 × 36 / 18 = 20 %, from the weighed shot (handbook worked espresso).
    expect(computeBrew(brewInputOf(stored, [{ id: readingIds[0]!, value: 10 }], null)).yieldPercent).toBeCloseTo(20, 10)
  })

  it('keeps an attempt\'s change note and its session with the brew', () => {
    const session = '0190a8c4-0000-7000-8000-0000000000d1'
    const { stored, again } = roundTrip({ byDifference: false, dose: '15', beverageMass: '240', changeNote: ' two clicks finer ', context: { kind: 'quick', refId: null, sessionId: session } })
    expect(stored).toMatchObject({ changeNote: 'two clicks finer', context: { sessionId: session } })
    expect(again.changeNote).toBe('two clicks finer')
  })
})
