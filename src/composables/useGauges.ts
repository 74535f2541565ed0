import type { Ref } from 'vue'
import type { CalibrationFit, CalibrationPoint, ReadingKind } from '../../shared/brewing'
import type { LocalRecord } from '../db/database'
import { computed } from 'vue'
import { BrewingInputError, fitCalibration } from '../../shared/brewing'
import { db } from '../db/database'
import { useLiveQuery } from './useLiveQuery'

/** An instrument and the calibration it uses now, with the line fitted on this phone. */
export interface Gauge {
  instrument: LocalRecord
  kind: ReadingKind
  calibration: LocalRecord | null
  /** The active calibration's line: computed here, so a calibration made offline works at once. */
  fit: CalibrationFit | null
  standardUnit: 'brix' | 'tds' | null
}

/** The line of a calibration record, or null when its standards cannot give one. */
export function fitOf(calibration: LocalRecord | null | undefined): CalibrationFit | null {
  if (!calibration)
    return null
  try {
    return fitCalibration(calibration.points as CalibrationPoint[])
  }
  catch (error) {
    if (error instanceof BrewingInputError)
      return null
    throw error
  }
}

export function gaugeOf(instrument: LocalRecord, calibration: LocalRecord | null): Gauge {
  const fit = fitOf(calibration)
  return {
    instrument,
    kind: instrument.readingKind as ReadingKind,
    calibration: fit ? calibration : null,
    fit,
    standardUnit: fit ? (calibration!.standardUnit as 'brix' | 'tds') : null,
  }
}

/** The team's refractometers on this phone, each with its active calibration. */
export function useGauges(teamId: Ref<string | null>) {
  const { value, state } = useLiveQuery(async () => {
    if (!teamId.value)
      return [] as Gauge[]
    const instruments = (await db.instruments.where('teamId').equals(teamId.value).toArray()).filter(i => !i.deletedAt)
    const active = await db.calibrations.where('teamId').equals(teamId.value).filter(c => c.active === true && !c.deletedAt).toArray()
    const byInstrument = new Map(active.map(row => [String(row.instrumentId), row]))
    return instruments
      .sort((a, b) => String(a.label).localeCompare(String(b.label)))
      .map(instrument => gaugeOf(instrument, byInstrument.get(instrument.id) ?? null))
  }, [] as Gauge[], teamId)
  const byId = computed(() => new Map(value.value.map(gauge => [gauge.instrument.id, gauge])))
  return { gauges: value, byId, state }
}

export const kindUnits: Record<ReadingKind, string> = { nD: 'nD', brix: '°Brix', tds: '%TDS' }
