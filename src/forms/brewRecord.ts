import type { BrewInput } from '../../shared/brewing'
import type { BrewForm, BrewOutcome, ContextKind } from '../composables/useBrewForm'
import type { Gauge } from '../composables/useGauges'
import type { LocalRecord } from '../db/database'
import { emptyBrewForm, lrrText } from '../composables/useBrewForm'
import { fitOf } from '../composables/useGauges'
import { formatDuration, numberText, readDuration, readNumber } from './numbers'

const blank = (text: string): number | null => readNumber(text).value

/** The brew record's fields from the form, as the brew schema (shared/schemas/entities.ts) has them. */
export function brewDataOf(form: BrewForm, outcome: BrewOutcome, gauge: Gauge | null): Record<string, unknown> {
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
    waterMass: blank(form.waterMass),
    // The LRR the result used (typed or the common-practice default), so the record shows it.
    retainedRatio: result.retainedRatio,
    grindSetting: form.grindSetting.trim(),
    contactTimeSeconds: readDuration(form.contactTime).value,
    waterTemperatureC: blank(form.waterTemperature),
    notes: form.notes.trim(),
    excludedReadingIds: form.readings.flatMap(reading => (reading.excluded && reading.id ? [reading.id] : [])),
  }
}

/** The readings typed on this screen, not yet stored, as reading records. */
export function newReadingsOf(form: BrewForm, outcome: BrewOutcome, gauge: Gauge | null, takenAt: string): Record<string, unknown>[] {
  return form.readings.filter(reading => !reading.id).map(reading => ({
    value: reading.value,
    kind: outcome.strength.kind,
    temperatureC: null,
    instrumentId: gauge?.instrument.id ?? null,
    calibrationId: outcome.strength.source === 'calibration' ? gauge?.calibration?.id ?? null : null,
    takenAt,
  }))
}

/** Whether a stored brew's masses were weighed as gross and tare (else as net masses). */
export const weighedByDifference = (brew: LocalRecord): boolean => brew.doseGross != null || brew.beverageGross != null

/** A stored brew back in the form, to edit it: readings keep their ids and can only be set aside. */
export function formOfBrew(brew: LocalRecord, readings: LocalRecord[]): BrewForm {
  const excluded = new Set((brew.excludedReadingIds as string[] | undefined) ?? [])
  const context = brew.context as { kind: ContextKind, refId: string | null }
  return {
    ...emptyBrewForm(),
    context: { kind: context.kind, refId: context.refId },
    method: brew.method as BrewForm['method'],
    instrumentId: (brew.instrumentId as string | null) ?? null,
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
    retainedRatio: numberText(brew.retainedRatio) || lrrText(brew.method as BrewForm['method']),
    grindSetting: String(brew.grindSetting ?? ''),
    contactTime: formatDuration(brew.contactTimeSeconds as number | null),
    waterTemperature: numberText(brew.waterTemperatureC),
    notes: String(brew.notes ?? ''),
    readings: readings.map(reading => ({ id: reading.id, value: Number(reading.value), excluded: excluded.has(reading.id) })),
  }
}

/** A stored brew as the core's input: its readings but the set-aside ones, through its calibration. */
export function brewInputOf(brew: LocalRecord, readings: LocalRecord[], calibration: LocalRecord | undefined): BrewInput {
  const excluded = new Set((brew.excludedReadingIds as string[] | undefined) ?? [])
  const fit = fitOf(calibration)
  return {
    ...(brew as unknown as Omit<BrewInput, 'readings' | 'calibration'>),
    readings: readings.filter(reading => !excluded.has(reading.id)).map(reading => Number(reading.value)),
    calibration: fit ? { fit, standardUnit: calibration!.standardUnit as 'brix' | 'tds' } : null,
  }
}
