import type { Ref } from 'vue'
import type { BoardCup, RoundRecords } from '../../shared/records/round-board'
import type { EntityData, EntityName } from '../../shared/schemas/entities'
import type { AnyLocalRecord, LocalRecord, OutboxEntry } from '../db/database'
import { computed } from 'vue'
import { definitionOf } from '../../shared/records/registry'
import { instrumentsOfRound, roundBoard, roundPlan } from '../../shared/records/round-board'
import { db } from '../db/database'
import { capital } from '../forms/words'
import { useLiveQuery } from './useLiveQuery'
import { useTeamZones } from './useTeamZones'

/** A record of the round that waits for the person on this phone: refused or in conflict. */
export interface RoundProblem { title: string, reason: string }

const live = <T extends { deletedAt: string | null }>(rows: T[]): T[] => rows.filter(row => !row.deletedAt)

interface RoundRows {
  entries: LocalRecord<'entry'>[]
  brews: LocalRecord<'brew'>[]
  readings: LocalRecord<'reading'>[]
  instruments: LocalRecord<'instrument'>[]
  calibrations: LocalRecord<'calibration'>[]
  zeroChecks: LocalRecord<'zeroCheck'>[]
  round: LocalRecord<'round'> | undefined
  event: LocalRecord<'event'> | undefined
  signoffs: LocalRecord<'signoff'>[]
  problems: RoundProblem[]
}

/** Records of the round on this phone that are refused or in conflict, with the reason to show. */
function problemsOf(records: { entity: EntityName, record: AnyLocalRecord }[], refused: OutboxEntry[]): RoundProblem[] {
  const byId = new Map(records.map(item => [item.record.id, item]))
  const titleOf = ({ entity, record }: { entity: EntityName, record: AnyLocalRecord }): string => capital(`${definitionOf(entity).noun.one}: ${definitionOf(entity).title(record)}`)
  const problems: RoundProblem[] = []
  for (const entry of refused) {
    const item = byId.get(entry.id)
    if (item)
      problems.push({ title: titleOf(item), reason: entry.rejected?.reason ?? 'Refused by the team server.' })
  }
  for (const item of records) {
    if (item.record.sync.state === 'conflict')
      problems.push({ title: titleOf(item), reason: 'It was changed on another phone too: choose which copy to keep.' })
  }
  return problems
}

/**
 * One round with everything its board needs, read from this phone's store (offline as online):
 * the round and its event, its cups, their pours and readings, the instruments and their zero
 * checks, a sign-off queued here, and what waits for the person.
 */
export function useRound(roundId: Ref<string>, teamId: Ref<string | null>) {
  const zones = useTeamZones(teamId)
  const initial: RoundRows = { entries: [], brews: [], readings: [], instruments: [], calibrations: [], zeroChecks: [], round: undefined, event: undefined, signoffs: [], problems: [] }
  const { value: rows, state } = useLiveQuery(async (): Promise<RoundRows> => {
    const round = await db.rounds.get(roundId.value)
    if (!round || !teamId.value)
      return initial
    const event = await db.events.get(round.eventId)
    const entries = await db.entries.where('roundId').equals(round.id).toArray()
    const cupIds = new Set(entries.map(entry => entry.id))
    // The round's pours, found by the cup they were measured for (an index), not among every brew of the team.
    const team = teamId.value
    const brews = cupIds.size ? await db.brews.where('context.refId').anyOf([...cupIds]).filter(brew => brew.teamId === team && brew.context.kind === 'entry').toArray() : []
    const readings = brews.length ? await db.readings.where('brewId').anyOf(brews.map(brew => brew.id)).toArray() : []
    const [instruments, calibrations, zeroChecks, signoffs, refused] = await Promise.all([
      db.instruments.where('teamId').equals(teamId.value).toArray(),
      db.calibrations.where('teamId').equals(teamId.value).toArray(),
      db.zeroChecks.where('teamId').equals(teamId.value).toArray(),
      db.signoffs.where('roundId').equals(round.id).toArray(),
      db.outbox.filter(entry => Boolean(entry.rejected)).toArray(),
    ])
    const mine: { entity: EntityName, record: AnyLocalRecord }[] = [
      { entity: 'round', record: round },
      ...entries.map(record => ({ entity: 'entry' as const, record })),
      ...brews.map(record => ({ entity: 'brew' as const, record })),
      ...readings.map(record => ({ entity: 'reading' as const, record })),
      ...signoffs.map(record => ({ entity: 'signoff' as const, record })),
    ]
    return { round, event, entries, brews, readings, instruments, calibrations, zeroChecks, signoffs, problems: problemsOf(mine, refused) }
  }, initial, () => [roundId.value, teamId.value])

  const round = computed(() => (rows.value.round && !rows.value.round.deletedAt ? rows.value.round : undefined))
  const plan = computed(() => (round.value ? roundPlan(round.value, rows.value.event, zones.find) : null))
  const records = computed<RoundRecords>(() => rows.value)
  const cups = computed(() => (plan.value ? roundBoard(records.value, plan.value) : []))
  const instruments = computed(() => instrumentsOfRound(cups.value))
  /** Signed off on the server, or queued on this phone and on its way. */
  const signedOff = computed(() => round.value?.derived ?? null)
  const queuedSignoff = computed(() => live(rows.value.signoffs).find(signoff => signoff.sync.state === 'pending') ?? null)
  const frozen = computed(() => Boolean(signedOff.value || queuedSignoff.value))

  return { state, rows, round, event: computed(() => rows.value.event), plan, cups, instruments, signedOff, queuedSignoff, frozen, problems: computed(() => rows.value.problems), zones }
}

export type RoundView = ReturnType<typeof useRound>

/** The items of the check list before sign-off, as the sign-off record keeps them. */
export type Checklist = EntityData<'signoff'>['checklist']

/** Where each item of the check list stands: measured as expected, flagged cups seen, nothing waiting, zero-checked. */
export function checklistOf(cups: BoardCup[], seen: readonly string[], problems: RoundProblem[], unchecked: string[]): Checklist {
  return {
    cupsMeasured: cups.length > 0 && cups.every(cup => cup.summary.complete),
    flaggedSeen: cups.filter(cup => cup.summary.flagged).every(cup => seen.includes(cup.entry.id)),
    conflictsSettled: problems.length === 0,
    zeroChecked: unchecked.length === 0,
  }
}
