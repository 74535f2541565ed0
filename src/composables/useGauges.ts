import type { Ref } from 'vue'
import type { CalibrationFit, ReadingKind } from '../../shared/brewing'
import type { LocalRecord } from '../db/database'
import { computed } from 'vue'
import { lineOf } from '../../shared/records/brew-input'
import { db } from '../db/database'
import { useLiveQuery } from './useLiveQuery'

/** An instrument and the calibration it uses now, with the line fitted on this phone. */
export interface Gauge {
  instrument: LocalRecord<'instrument'>
  kind: ReadingKind
  calibration: LocalRecord<'calibration'> | null
  /** The active calibration's line: computed here, so a calibration made offline works at once. */
  fit: CalibrationFit | null
  standardUnit: 'brix' | 'tds' | null
}

export function gaugeOf(instrument: LocalRecord<'instrument'>, calibration: LocalRecord<'calibration'> | null): Gauge {
  const fit = lineOf(calibration)
  return {
    instrument,
    kind: instrument.readingKind,
    calibration: fit ? calibration : null,
    fit,
    standardUnit: fit && calibration ? calibration.standardUnit : null,
  }
}

/** The team's refractometers on this phone, each with its active calibration. */
export function useGauges(teamId: Ref<string | null>) {
  const { value, state } = useLiveQuery(async () => {
    if (!teamId.value)
      return [] as Gauge[]
    const instruments = (await db.instruments.where('teamId').equals(teamId.value).toArray()).filter(i => !i.deletedAt)
    const active = await db.calibrations.where('teamId').equals(teamId.value).filter(c => c.active && !c.deletedAt).toArray()
    const byInstrument = new Map(active.map(row => [row.instrumentId, row]))
    return instruments
      .sort((a, b) => a.label.localeCompare(b.label))
      .map(instrument => gaugeOf(instrument, byInstrument.get(instrument.id) ?? null))
  }, [] as Gauge[], teamId)
  const byId = computed(() => new Map(value.value.map(gauge => [gauge.instrument.id, gauge])))
  return { gauges: value, byId, state }
}

export const kindUnits: Record<ReadingKind, string> = { nD: 'nD', brix: '°Brix', tds: '%TDS' }
