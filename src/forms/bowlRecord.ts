import type { BrewResult } from '../../shared/brewing'
import type { EntityDerived } from '../../shared/schemas/records'
import type { Gauge } from '../composables/useGauges'
import type { LocalRecord } from '../db/database'
import type { BrewFields, NewReading } from './brewRecord'
import { computeBrew, defaultBrixFactor, readingRanges } from '../../shared/brewing'
import { strengthSourceOf } from '../composables/useBrewForm'
import { readNumber } from './numbers'

/** One bowl as typed on the table: its dose and water, and its readings separated by spaces. */
export interface BowlEntry { dose: string, water: string, readings: string }

export interface BowlOutcome {
  result: BrewResult
  /** Fields whose text cannot be read, by name (dose, water, readings). */
  invalid: ('dose' | 'water' | 'readings')[]
  readings: number[]
}

/** The readings of a bowl as typed: "1.12 1.13" or "1,12; 1,13" (a comma is a decimal mark). */
export function readBowlReadings(text: string): { values: number[], error: boolean } {
  const parts = text.split(/[\s;]+/).filter(Boolean)
  const read = parts.map(part => readNumber(part))
  return { values: read.flatMap(r => (r.value === null ? [] : [r.value])), error: read.some(r => r.error) }
}

/** What a bowl gives as typed, through the chosen refractometer (or readings typed as %TDS). */
export function bowlOutcome(entry: BowlEntry, gauge: Gauge | null): BowlOutcome {
  const strength = strengthSourceOf(gauge, 'direct')
  const dose = readNumber(entry.dose)
  const water = readNumber(entry.water)
  const readings = readBowlReadings(entry.readings)
  const range = readingRanges[strength.kind]
  // A reading no refractometer of this kind shows is refused here, as the server would.
  readings.error ||= readings.values.some(value => value < range.min || value > range.max)
  const invalid: BowlOutcome['invalid'] = [...(dose.error ? ['dose' as const] : []), ...(water.error ? ['water' as const] : []), ...(readings.error ? ['readings' as const] : [])]
  const result = computeBrew({
    method: 'immersion',
    strengthSource: strength.source,
    calibration: strength.calibration,
    brixFactor: strength.usesFactor ? gauge?.instrument.brixFactor ?? defaultBrixFactor : null,
    readings: readings.values,
    dose: dose.value,
    waterMass: water.value,
  })
  return { result, invalid, readings: readings.values }
}

/**
 * A bowl's brew record and its readings: a full immersion for the lot on this table, at the table's
 * grind and temperature, the water taken as grams (1 mL ≈ 1 g, as ratio.ts does).
 */
export function bowlRecord(table: LocalRecord<'cuppingTable'>, lotId: string, entry: BowlEntry, gauge: Gauge | null, brewedAt: string): { data: BrewFields & { brewedAt: string }, readings: NewReading[], derived: EntityDerived<'brew'> } | null {
  const { result, invalid, readings } = bowlOutcome(entry, gauge)
  if (invalid.length || result.tdsPercent === null || result.yieldPercent === null)
    return null
  const strength = strengthSourceOf(gauge, 'direct')
  const calibrationId = strength.source === 'calibration' ? gauge?.calibration?.id ?? null : null
  return {
    data: {
      context: { kind: 'lot', refId: lotId, tableId: table.id },
      method: 'immersion',
      instrumentId: gauge?.instrument.id ?? null,
      calibrationId,
      strengthSource: strength.source,
      brixFactor: strength.usesFactor ? gauge?.instrument.brixFactor ?? defaultBrixFactor : null,
      dose: readNumber(entry.dose).value,
      doseGross: null,
      doseTare: null,
      beverageMass: null,
      beverageGross: null,
      beverageTare: null,
      waterMass: readNumber(entry.water).value,
      retainedRatio: null,
      grindSetting: table.grind,
      contactTimeSeconds: null,
      waterTemperatureC: table.waterTemperatureC,
      notes: '',
      excludedReadingIds: [],
      changeNote: '',
      brewedAt,
    },
    // A bowl keeps every reading: its evenness is judged against the other bowls, not within itself.
    readings: readings.map(value => ({ data: { value, kind: strength.kind, temperatureC: null, instrumentId: gauge?.instrument.id ?? null, calibrationId, takenAt: brewedAt }, leftOut: false })),
    derived: { tdsPercent: result.tdsPercent, yieldPercent: result.yieldPercent },
  }
}
