import type { BoardCup, BoardPour, BoardReading, RoundRecords, Stored } from './round-board'
import { computeBrew, formatAtStep, formatMass, formatTds, formatYield, readingRanges, scaleStepOf } from '../brewing'
import { brewInputOf } from './brew-input'

// A round's results as a table: one row per reading of every pour of every cup, so a dispute can be
// settled from the file alone. The server sends it as results.csv; a phone without signal makes
// the same rows from its own copy of the records.

/** The columns of results.csv, in order (the first seven are a published contract). */
export const resultColumns = [
  'code',
  'competitor',
  'pour',
  'reading',
  'tds_percent',
  'extraction_percent',
  'flag',
  'reading_value',
  'reading_unit',
  'set_aside',
  'pour_tds_percent',
  'pour_extraction_percent',
  'cup_mean_tds_percent',
  'cup_mean_extraction_percent',
  'cup_tds_range',
  'cup_extraction_range',
  'dose_g',
  'beverage_g',
  'judge',
  'instrument',
  'calibration',
  'zero_check',
  'time',
] as const
export type ResultRow = Record<(typeof resultColumns)[number], string>

/** Names the rows use for people, read from the team's members. */
export interface ResultNames {
  judge: (userId: string) => string
}

const blankRow = (): ResultRow => Object.fromEntries(resultColumns.map(column => [column, ''])) as ResultRow
const units = { nD: 'nD', brix: '°Brix', tds: '%TDS' } as const
const figure = (value: number | null | undefined, format: (n: number) => string): string => (value == null ? '' : format(value))
/** A moment to the minute, in UTC, ISO 8601: "2026-05-01T09:12Z". */
export const minuteUtc = (iso: string): string => `${new Date(iso).toISOString().slice(0, 16)}Z`

/** How a pour's readings became %TDS, in words: the calibration's date and standards, or the factor. */
export function calibrationText(brew: Stored<'brew'>, calibrations: ReadonlyMap<string, Stored<'calibration'>>): string {
  if (brew.strengthSource === 'direct')
    return 'readings in %TDS'
  if (brew.strengthSource === 'brix-factor')
    return `°Brix × ${brew.brixFactor ?? 0.85}`
  const calibration = brew.calibrationId ? calibrations.get(brew.calibrationId) : undefined
  if (!calibration)
    return 'a calibration not on record'
  const standards = calibration.standardUnit === 'brix' ? 'sucrose °Brix' : 'coffee %TDS'
  return `line of ${minuteUtc(calibration.calibratedAt)}, ${calibration.points.length} ${standards} standards`
}

function zeroText(reading: BoardReading): string {
  if (!reading.instrumentId)
    return 'no instrument named'
  return reading.zeroCheck ? `passed ${minuteUtc(reading.zeroCheck.checkedAt)}` : 'none that day'
}

/**
 * The rows of a round's results, cups by code, pours and readings in the order they were made. A
 * pour not read yet still has one row, so no pour goes missing from the file.
 * @param cups - the round's board (shared/records/round-board.ts)
 * @param records - the instruments and calibrations its pours were read with
 * @param names - people's names
 * @param showCompetitor - whether the reader may see competitors' names (shared/records/rules.ts)
 */
export function resultRows(cups: BoardCup[], records: Pick<RoundRecords, 'instruments' | 'calibrations'>, names: ResultNames, showCompetitor: boolean): ResultRow[] {
  const instruments = new Map(records.instruments.map(i => [i.id, i]))
  const calibrations = new Map(records.calibrations.map(c => [c.id, c]))
  return cups.flatMap((cup) => {
    const { summary } = cup
    const cupColumns = {
      code: cup.entry.code,
      competitor: showCompetitor ? cup.entry.contestant : '',
      flag: cup.flag,
      cup_mean_tds_percent: figure(summary.tds?.mean, formatTds),
      cup_mean_extraction_percent: figure(summary.yield?.mean, formatYield),
      cup_tds_range: figure(summary.tds?.range, formatTds),
      cup_extraction_range: figure(summary.yield?.range, formatYield),
    }
    if (cup.pours.length === 0)
      return [{ ...blankRow(), ...cupColumns }]
    return cup.pours.flatMap((pour) => {
      const pourColumns = pourRow(pour, calibrations, names)
      if (pour.readings.length === 0)
        return [{ ...blankRow(), ...cupColumns, ...pourColumns }]
      return pour.readings.map((reading): ResultRow => {
        const instrument = reading.instrumentId ? instruments.get(reading.instrumentId) : undefined
        // This reading alone through the pour's calibration and masses: what it says on its own.
        const alone = computeBrew(brewInputOf({ ...pour.brew, excludedReadingIds: [] }, [reading.reading], pour.brew.calibrationId ? calibrations.get(pour.brew.calibrationId) : null))
        const kind = reading.reading.kind
        return {
          ...blankRow(),
          ...cupColumns,
          ...pourColumns,
          reading: String(reading.number),
          tds_percent: figure(alone.tdsPercent, formatTds),
          extraction_percent: figure(alone.yieldPercent, formatYield),
          reading_value: formatAtStep(reading.reading.value, instrument?.resolution ?? readingRanges[kind].step),
          reading_unit: units[kind],
          set_aside: reading.excluded ? 'yes' : 'no',
          instrument: instrument?.label ?? (reading.instrumentId ? 'an instrument not on record' : ''),
          zero_check: zeroText(reading),
          time: minuteUtc(reading.reading.takenAt),
        }
      })
    })
  })
}

function pourRow(pour: BoardPour, calibrations: ReadonlyMap<string, Stored<'calibration'>>, names: ResultNames): Partial<ResultRow> {
  const { brew } = pour
  const masses = computeBrew(brewInputOf(brew, [], null))
  const doseStep = scaleStepOf(brew.dose, brew.doseGross, brew.doseTare)
  const beverageStep = scaleStepOf(brew.beverageMass, brew.beverageGross, brew.beverageTare)
  return {
    pour: String(pour.number),
    pour_tds_percent: figure(pour.tdsPercent, formatTds),
    pour_extraction_percent: figure(pour.yieldPercent, formatYield),
    dose_g: figure(masses.dose, mass => formatMass(mass, doseStep)),
    beverage_g: masses.beverageEstimated ? '' : figure(masses.beverageMass, mass => formatMass(mass, beverageStep)),
    judge: names.judge(brew.createdBy),
    calibration: calibrationText(brew, calibrations),
    time: minuteUtc(brew.brewedAt),
  }
}
