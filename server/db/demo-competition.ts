import type { DemoMutation } from './demo-origin'
import { newBlindCodes } from '../../shared/records/blind-codes'

/** Builds one demo mutation; the caller's `put` gives it ids and the team. */
type Put = (entity: string, data: Record<string, unknown>) => DemoMutation

/**
 * The demo competition, all invented: the Kestrel Quay Brewers Open at the Net Loft Hall, judged
 * against the European drip zone. Heat 1 was judged yesterday and signed off by the head judge;
 * Heat 2 is under way today, half of its cups measured. Codes are drawn at random, as the app draws
 * them; the competitors' names are known to the head judge only until a heat is signed off.
 */
export function demoCompetition(put: Put, people: { owner: string, lead: string, member: string }, pen: DemoMutation, at: (daysAgo: number, hour: number) => string, now: number) {
  const ago = (minutes: number): string => new Date(now - minutes * 60_000).toISOString()
  const event = put('event', { name: 'Kestrel Quay Brewers Open', venue: 'Net Loft Hall', startsOn: at(1, 0).slice(0, 10), endsOn: new Date(now).toISOString().slice(0, 10), zoneId: 'european-drip', toleranceTdsPercent: 0.05, toleranceYieldPercent: 0.5 })
  const judges = [people.lead, people.member]
  const heat1 = put('round', { eventId: event.id, name: 'Heat 1', position: 1, poursPerCup: 2, readingsPerPour: 2, judgeIds: judges })
  const heat2 = put('round', { eventId: event.id, name: 'Heat 2', position: 2, poursPerCup: 2, readingsPerPour: 2, judgeIds: judges })
  const codes = newBlindCodes(7, [])
  const cup = (round: DemoMutation, code: string, contestant: string) => put('entry', { roundId: round.id, code, contestant, notes: '' })
  const first = [cup(heat1, codes[0]!, 'Mirren Haskett'), cup(heat1, codes[1]!, 'Joss Pellow'), cup(heat1, codes[2]!, 'Anwen Tregear')]
  const second = [cup(heat2, codes[3]!, 'Idris Coldharbour'), cup(heat2, codes[4]!, 'Saffi Rendle'), cup(heat2, codes[5]!, 'Lowen Maddern'), cup(heat2, codes[6]!, 'Tamsin Ruddle')]

  /** One pour of a cup, 15.0 g of coffee, read twice on the bar pen. */
  const pour = (entry: DemoMutation, brewedAt: string, beverageMass: number, values: number[]): DemoMutation[] => {
    const brew = put('brew', { context: { kind: 'entry', refId: entry.id }, method: 'percolation', instrumentId: pen.id, calibrationId: null, strengthSource: 'direct', dose: 15, beverageMass, notes: '', brewedAt })
    return [brew, ...values.map(value => put('reading', { brewId: brew.id, value, kind: 'tds', temperatureC: null, instrumentId: pen.id, calibrationId: null, takenAt: brewedAt }))]
  }
  // Distilled water on the pen before each day's judging (0.00 and 0.01 %TDS: within 0.03).
  const checks = [put('zeroCheck', { instrumentId: pen.id, kind: 'tds', reading: 0, checkedAt: at(1, 8), notes: '' }), put('zeroCheck', { instrumentId: pen.id, kind: 'tds', reading: 0.01, checkedAt: ago(45), notes: '' })]
  const measured = [
    // Heat 1: the second cup is strong and over-extracted, past what the heat allows.
    ...pour(first[0]!, at(1, 9), 232, [1.31, 1.33]),
    ...pour(first[0]!, at(1, 9.2), 232, [1.34, 1.32]),
    ...pour(first[1]!, at(1, 9.4), 228, [1.52, 1.53]),
    ...pour(first[1]!, at(1, 9.6), 228, [1.55, 1.54]),
    ...pour(first[2]!, at(1, 9.8), 236, [1.22, 1.24]),
    ...pour(first[2]!, at(1, 10), 236, [1.25, 1.23]),
    // Heat 2, under way: one cup done, one started, two waiting.
    ...pour(second[0]!, ago(35), 234, [1.36, 1.37]),
    ...pour(second[0]!, ago(25), 234, [1.35, 1.36]),
    ...pour(second[1]!, ago(15), 230, [1.28, 1.29]),
  ]
  const checklist = { cupsMeasured: true, flaggedSeen: true, conflictsSettled: true, zeroChecked: true }
  const signoff = put('signoff', { roundId: heat1.id, checklist, seenEntryIds: [first[1]!.id], note: 'Cup re-poured once after a spill at the bar; both pours kept.' })
  return { setUp: [event, heat1, heat2, ...first, ...second, checks[0]!], measured: [checks[1]!, ...measured], signedOff: [signoff] }
}
