import type { EntityData } from '../../shared/schemas/entities'
import type { BrewForm, BrewOutcome } from '../composables/useBrewForm'
import type { Gauge } from '../composables/useGauges'
import type { LocalRecord } from '../db/database'
import { weighedByDifference } from '../../shared/records/brew-input'
import { emptyBrewForm, lrrText } from '../composables/useBrewForm'
import { formatDuration, numberText, readDuration, readNumber } from './numbers'

const blank = (text: string): number | null => readNumber(text).value

/** A brew's fields as the form gives them; `brewedAt` is added when it is first saved. */
export type BrewFields = Omit<EntityData<'brew'>, 'brewedAt'>
/** A reading typed on the form, before it knows its brew. */
export type ReadingFields = Omit<EntityData<'reading'>, 'brewId'>

/** The brew record's fields from the form, as the brew schema (shared/schemas/entities.ts) has them. */
export function brewDataOf(form: BrewForm, outcome: BrewOutcome, gauge: Gauge | null): BrewFields {
  const { strength, result } = outcome
  return {
    context: { ...form.context },
    method: form.method,
    instrumentId: gauge?.instrument.id ?? null,
    calibrationId: strength.source === 'calibration' ? gauge?.calibration?.id ?? null : null,
    strengthSource: strength.source,
    brixFactor: strength.usesFactor ? blank(form.brixFactor) : null,
    ...(form.byDifference
      ? { dose: null, beverageMass: null, doseGross: blank(form.doseGross), doseTare: blank(form.doseTare), beverageGross: blank(form.beverageGross), beverageTare: blank(form.beverageTare) }
      : { dose: blank(form.dose), beverageMass: blank(form.beverageMass), doseGross: null, doseTare: null, beverageGross: null, beverageTare: null }),
    // The water the result used: none for an espresso, whatever its hidden field still holds.
    waterMass: outcome.input.waterMass ?? null,
    // The LRR the result used (typed or the common-practice default), so the record shows it.
    retainedRatio: result.retainedRatio,
    grindSetting: form.grindSetting.trim(),
    contactTimeSeconds: readDuration(form.contactTime).value,
    waterTemperatureC: blank(form.waterTemperature),
    notes: form.notes.trim(),
    excludedReadingIds: form.readings.flatMap((reading, index) => ((reading.excluded || (outcome.outlier?.leftOut && outcome.outlier.index === index)) && reading.id ? [reading.id] : [])),
    changeNote: form.changeNote.trim(),
  }
}

/** A reading typed on this screen, not stored yet, and whether the result leaves it out (an outlier). */
export interface NewReading { data: ReadingFields, leftOut: boolean }

/** The readings typed on this screen, not yet stored, as reading records. */
export function newReadingsOf(form: BrewForm, outcome: BrewOutcome, gauge: Gauge | null, takenAt: string): NewReading[] {
  return form.readings.flatMap((reading, index) => (reading.id
    ? []
    : [{
        data: {
          value: reading.value,
          kind: outcome.strength.kind,
          temperatureC: null,
          instrumentId: gauge?.instrument.id ?? null,
          calibrationId: outcome.strength.source === 'calibration' ? gauge?.calibration?.id ?? null : null,
          takenAt,
        },
        leftOut: Boolean(outcome.outlier?.leftOut && outcome.outlier.index === index),
      }]))
}

/** A stored brew back in the form, to edit it: readings keep their ids and can only be set aside. */
export function formOfBrew(brew: EntityData<'brew'>, readings: readonly Pick<LocalRecord<'reading'>, 'id' | 'value'>[]): BrewForm {
  const excluded = new Set(brew.excludedReadingIds)
  return {
    ...emptyBrewForm(),
    // The whole context, so an edited bowl stays on its cupping table.
    context: { ...brew.context },
    method: brew.method,
    instrumentId: brew.instrumentId,
    manualSource: brew.strengthSource === 'brix-factor' ? 'brix-factor' : 'direct',
    brixFactor: numberText(brew.brixFactor) || '0.85',
    byDifference: weighedByDifference(brew),
    dose: numberText(brew.dose),
    doseGross: numberText(brew.doseGross),
    doseTare: numberText(brew.doseTare),
    beverageMass: numberText(brew.beverageMass),
    beverageGross: numberText(brew.beverageGross),
    beverageTare: numberText(brew.beverageTare),
    waterMass: numberText(brew.waterMass),
    retainedRatio: numberText(brew.retainedRatio) || lrrText(brew.method),
    grindSetting: brew.grindSetting,
    contactTime: formatDuration(brew.contactTimeSeconds),
    waterTemperature: numberText(brew.waterTemperatureC),
    notes: brew.notes,
    // A reading left out as an outlier comes back set aside, which is what it is on record.
    readings: readings.map(reading => ({ id: reading.id, value: reading.value, excluded: excluded.has(reading.id), kept: true })),
    changeNote: brew.changeNote,
  }
}
