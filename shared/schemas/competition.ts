import { z } from 'zod'
import { readingRanges } from '../brewing/readings'
import { ReadingKindSchema } from './brewing'
import { freeText, IdSchema, nameText } from './primitives'

// What a competition records: the event and its rounds with their zone, tolerances and what each
// cup gets, the cups under blind codes, each instrument's zero check, and the head judge's sign-off.

const id = IdSchema
const name = nameText(120)
const day = z.iso.date({ error: 'must be a date (YYYY-MM-DD)' })
const when = z.iso.datetime({ offset: true, error: 'must be a date and time' })

/** Largest allowed distance from the target zone, per axis, before a cup is flagged (null: none). */
const toleranceTds = z.number().nonnegative().max(5).nullable().default(null)
const toleranceYield = z.number().nonnegative().max(20).nullable().default(null)

export const EventDataSchema = z.strictObject({
  name,
  venue: freeText(120).default(''),
  startsOn: day.nullable().default(null),
  endsOn: day.nullable().default(null),
  zoneId: freeText(64).default('us-drip'),
  /** The tolerances every round of the event uses unless it sets its own. */
  toleranceTdsPercent: toleranceTds,
  toleranceYieldPercent: toleranceYield,
})
export const RoundDataSchema = z.strictObject({
  eventId: id,
  name,
  position: z.number().int().min(0).max(1000),
  /** Largest allowed distance from the target zone, per axis, before a cup is flagged; null: the event's. */
  toleranceTdsPercent: toleranceTds,
  toleranceYieldPercent: toleranceYield,
  /** The round's own target zone (a preset or a team zone id); null: the event's. */
  zoneId: freeText(64).nullable().default(null),
  /** How many pours each cup gets, and how many readings each pour. */
  poursPerCup: z.number().int('must be a whole number').min(1, 'must be at least 1').max(10, 'must be at most 10').default(2),
  readingsPerPour: z.number().int('must be a whole number').min(1, 'must be at least 1').max(10, 'must be at most 10').default(3),
  /** The judges on duty at the bar (user ids of team members). */
  judgeIds: z.array(id).max(12, 'must hold at most 12 judges').default([]),
})
export const EntryDataSchema = z.strictObject({ roundId: id, code: nameText(20), contestant: freeText(120).default(''), notes: freeText(2000).default('') })

/**
 * The head judge's sign-off of a round, queued on the phone like any record: what the check list
 * showed when it was signed, the flagged cups the judge looked at, and a note. The server freezes the
 * round when it applies it; an item left open needs the note to say why.
 */
export const SignoffDataSchema = z.strictObject({
  roundId: id,
  checklist: z.strictObject({
    cupsMeasured: z.boolean(),
    flaggedSeen: z.boolean(),
    conflictsSettled: z.boolean(),
    zeroChecked: z.boolean(),
  }),
  seenEntryIds: z.array(id).max(500).default([]),
  note: freeText(1000).default(''),
}).check((ctx) => {
  if (Object.values(ctx.value.checklist).some(done => !done) && !ctx.value.note)
    ctx.issues.push({ code: 'custom', path: ['note'], input: ctx.value.note, message: 'say why the round is signed off with an item of the check list still open' })
})

/**
 * A refractometer read against distilled water before judging: the reading and when. Whether it
 * passed is worked out from the reading by shared/brewing (zeroCheck), never taken from the phone.
 */
export const ZeroCheckDataSchema = z.strictObject({
  instrumentId: id,
  kind: ReadingKindSchema,
  reading: z.number(),
  /** With the phone's own UTC offset: "that day" is the day where the check was made. */
  checkedAt: when,
  notes: freeText(500).default(''),
}).check((ctx) => {
  const range = readingRanges[ctx.value.kind] as (typeof readingRanges)[keyof typeof readingRanges] | undefined
  if (range && !(ctx.value.reading >= range.min && ctx.value.reading <= range.max))
    ctx.issues.push({ code: 'custom', path: ['reading'], input: ctx.value.reading, message: `must be a reading from ${range.min} to ${range.max} in ${ctx.value.kind}` })
})
