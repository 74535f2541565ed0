import type { CupExpectation, CupSummary, RoundTolerance, Zone } from '../brewing'
import type { EntityData, EntityName } from '../schemas/entities'
import { computeBrew, defaultZone, flagText, sameDayAsCheck, summarizeCup, zeroCheck } from '../brewing'
import { brewInputOf } from './brew-input'

// A competition round's records as the judges' board sees them, on the phone and on the server
// alike: the round's zone, tolerance and expectations, and every cup with its pours worked out by
// the core from the stored readings (never from figures a phone sent).

/** A stored record as both sides hold it: its data, its id and who made it. */
export type Stored<E extends EntityName> = EntityData<E> & { id: string, createdBy: string, deletedAt?: string | null }

/** What the round asks of every cup, and the zone its verdicts belong to. */
export interface RoundPlan {
  zone: Zone
  /** Whose zone it is: the round's own, or the event's. */
  zoneSource: 'round' | 'event'
  tolerance: RoundTolerance
  expected: CupExpectation
}

/**
 * The round's zone (its own, else the event's, else the filter default), its tolerance per axis
 * (its own, else the event's, else none) and the pours and readings it expects per cup.
 * @param round - the round's record
 * @param event - its event's, when known
 * @param findZone - a preset or team zone by id
 */
export function roundPlan(round: EntityData<'round'>, event: EntityData<'event'> | undefined, findZone: (id: string) => Zone | undefined): RoundPlan {
  const own = round.zoneId ? findZone(round.zoneId) : undefined
  const zone = own ?? (event ? findZone(event.zoneId) : undefined) ?? defaultZone.filter
  return {
    zone,
    zoneSource: own ? 'round' : 'event',
    tolerance: {
      tdsPercent: round.toleranceTdsPercent ?? event?.toleranceTdsPercent ?? 0,
      yieldPercent: round.toleranceYieldPercent ?? event?.toleranceYieldPercent ?? 0,
    },
    expected: { pours: round.poursPerCup, readingsPerPour: round.readingsPerPour },
  }
}

/** The records of one round and what its pours were read with. */
export interface RoundRecords {
  entries: Stored<'entry'>[]
  /** Brews of the team; those measured for the round's cups are picked out. */
  brews: Stored<'brew'>[]
  readings: Stored<'reading'>[]
  instruments: Stored<'instrument'>[]
  calibrations: Stored<'calibration'>[]
  zeroChecks: Stored<'zeroCheck'>[]
}

export interface BoardReading {
  reading: Stored<'reading'>
  number: number
  excluded: boolean
  instrumentId: string | null
  /** A passed zero check of its instrument that day, or null (none, or no instrument named). */
  zeroCheck: Stored<'zeroCheck'> | null
}

export interface BoardPour {
  brew: Stored<'brew'>
  number: number
  tdsPercent: number | null
  yieldPercent: number | null
  readings: BoardReading[]
}

export interface BoardCup {
  entry: Stored<'entry'>
  pours: BoardPour[]
  summary: CupSummary
  /** The flagged axes in words, or ''. */
  flag: string
  /** Instruments this cup was read on without a passed zero check that day. */
  unchecked: string[]
  judgeIds: string[]
  instrumentIds: string[]
  calibrationIds: string[]
}

const live = <T extends { deletedAt?: string | null }>(rows: T[]): T[] => rows.filter(row => !row.deletedAt)
const byTime = <T extends { id: string }>(time: (row: T) => string) => (a: T, b: T): number => time(a).localeCompare(time(b)) || a.id.localeCompare(b.id)
const unique = (values: (string | null)[]): string[] => [...new Set(values.filter((v): v is string => v !== null))]

/** Passed zero checks by instrument. */
function passedChecks(records: RoundRecords): Map<string, Stored<'zeroCheck'>[]> {
  const found = new Map<string, Stored<'zeroCheck'>[]>()
  for (const check of live(records.zeroChecks)) {
    if (zeroCheck(check.reading, check.kind).passed)
      found.set(check.instrumentId, [...(found.get(check.instrumentId) ?? []), check])
  }
  return found
}

/**
 * Every cup of the round (by code), each with its pours in the order they were brewed, their
 * readings, the result of each pour and the cup's summary against the plan.
 */
export function roundBoard(records: RoundRecords, plan: RoundPlan): BoardCup[] {
  const checks = passedChecks(records)
  const calibrations = new Map(records.calibrations.map(c => [c.id, c]))
  const readingsOf = new Map<string, Stored<'reading'>[]>()
  for (const reading of live(records.readings))
    readingsOf.set(reading.brewId, [...(readingsOf.get(reading.brewId) ?? []), reading])
  const brewsOf = new Map<string, Stored<'brew'>[]>()
  for (const brew of live(records.brews)) {
    if (brew.context.kind === 'entry' && brew.context.refId)
      brewsOf.set(brew.context.refId, [...(brewsOf.get(brew.context.refId) ?? []), brew])
  }

  return live(records.entries).sort((a, b) => a.code.localeCompare(b.code)).map((entry) => {
    const pours = (brewsOf.get(entry.id) ?? []).sort(byTime(b => b.brewedAt)).map((brew, index): BoardPour => {
      const excluded = new Set(brew.excludedReadingIds)
      const all = (readingsOf.get(brew.id) ?? []).sort(byTime(r => r.takenAt))
      const result = computeBrew(brewInputOf(brew, all, brew.calibrationId ? calibrations.get(brew.calibrationId) : null))
      const readings = all.map((reading, i): BoardReading => {
        const instrumentId = reading.instrumentId ?? brew.instrumentId
        const check = instrumentId ? (checks.get(instrumentId) ?? []).find(c => sameDayAsCheck(c.checkedAt, reading.takenAt)) ?? null : null
        return { reading, number: i + 1, excluded: excluded.has(reading.id), instrumentId, zeroCheck: check }
      })
      return { brew, number: index + 1, tdsPercent: result.tdsPercent, yieldPercent: result.yieldPercent, readings }
    })
    const summary = summarizeCup(pours.map(p => ({ tdsPercent: p.tdsPercent, yieldPercent: p.yieldPercent, readings: p.readings.filter(r => !r.excluded).length })), plan.zone, plan.tolerance, plan.expected)
    const read = pours.flatMap(p => p.readings)
    return {
      entry,
      pours,
      summary,
      flag: flagText(summary),
      unchecked: unique(read.filter(r => r.instrumentId && !r.zeroCheck).map(r => r.instrumentId)),
      judgeIds: unique(pours.map(p => p.brew.createdBy)),
      instrumentIds: unique(read.map(r => r.instrumentId)),
      calibrationIds: unique(pours.map(p => p.brew.calibrationId)),
    }
  })
}

/** The instruments the round's cups were read on, and those among them with no zero check that day. */
export function instrumentsOfRound(cups: BoardCup[]): { used: string[], unchecked: string[] } {
  return { used: unique(cups.flatMap(cup => cup.instrumentIds)), unchecked: unique(cups.flatMap(cup => cup.unchecked)) }
}
