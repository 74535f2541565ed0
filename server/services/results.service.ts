import type { Role } from '../../shared/schemas/auth'
import type { EntityData, EntityName } from '../../shared/schemas/entities'
import type { Db } from '../db/client'
import type { Mailer } from '../mail/mailer'
import type { RecordRow } from '../sync/store'
import type { TeamsService } from './teams.service'
import { and, eq, inArray } from 'drizzle-orm'
import Papa from 'papaparse'
import { BrewingInputError, defineZone, findZonePreset, formatTds, formatYield } from '../../shared/brewing'
import { roundBoard, roundPlan } from '../../shared/records/round-board'
import { resultColumns, resultRows } from '../../shared/records/round-results'
import { can } from '../../shared/records/rules'
import { resultsFileName } from '../../shared/schemas/results'
import { records, users } from '../db/schema'
import { HttpError, notFoundError } from '../http-error'
import { audit } from './audit.service'

// A round's results, worked out on the server from the stored records with the shared core: the
// CSV every reading of every pour, and the same file e-mailed to the organisers.

const stored = <E extends EntityName>(row: RecordRow) => ({ ...(row.data as EntityData<E>), id: row.id, createdBy: row.createdBy, deletedAt: row.deletedAt?.toISOString() ?? null })

export function createResultsService(deps: { db: Db, teams: TeamsService, mailer: Mailer }) {
  const { db } = deps

  const rowsOf = async (teamId: string, entity: EntityName, parentIds: string[]): Promise<RecordRow[]> => (parentIds.length
    ? db.select().from(records).where(and(eq(records.teamId, teamId), eq(records.entity, entity), inArray(records.parentId, parentIds)))
    : [])

  /** The round, its event and every record its results are made of. */
  async function load(teamId: string, roundId: string) {
    const [round] = await db.select().from(records).where(and(eq(records.id, roundId), eq(records.teamId, teamId), eq(records.entity, 'round')))
    if (!round || round.deletedAt)
      throw notFoundError('round')
    const roundData = round.data as EntityData<'round'>
    const [event] = await db.select().from(records).where(and(eq(records.id, roundData.eventId), eq(records.teamId, teamId)))
    const entries = await rowsOf(teamId, 'entry', [round.id])
    const brews = await rowsOf(teamId, 'brew', entries.map(row => row.id))
    const readings = await rowsOf(teamId, 'reading', brews.map(row => row.id))
    const instruments = await db.select().from(records).where(and(eq(records.teamId, teamId), eq(records.entity, 'instrument')))
    const calibrations = await rowsOf(teamId, 'calibration', instruments.map(row => row.id))
    const zeroChecks = await rowsOf(teamId, 'zeroCheck', instruments.map(row => row.id))
    const zones = await db.select().from(records).where(and(eq(records.teamId, teamId), eq(records.entity, 'zone')))
    const findZone = (id: string) => findZonePreset(id) ?? teamZone(zones.find(row => row.id === id && !row.deletedAt))
    const plan = roundPlan(roundData, event ? stored<'event'>(event) : undefined, findZone)
    const set = {
      entries: entries.map(row => stored<'entry'>(row)),
      brews: brews.map(row => stored<'brew'>(row)),
      readings: readings.map(row => stored<'reading'>(row)),
      instruments: instruments.map(row => stored<'instrument'>(row)),
      calibrations: calibrations.map(row => stored<'calibration'>(row)),
      zeroChecks: zeroChecks.map(row => stored<'zeroCheck'>(row)),
    }
    const cups = roundBoard(set, plan)
    const names = await namesOf([...new Set(cups.flatMap(cup => cup.judgeIds))])
    return { round: roundData, signedOff: round.derived as { signedOffAt: string, signedOffBy: string } | null, event: event ? stored<'event'>(event) : undefined, plan, cups, set, names }
  }

  async function namesOf(ids: string[]): Promise<Map<string, string>> {
    const rows = ids.length ? await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, ids)) : []
    return new Map(rows.map(row => [row.id, row.name]))
  }

  /** The CSV text and its file name, for a reader of this role. */
  async function csvFor(teamId: string, roundId: string, role: Role) {
    const loaded = await load(teamId, roundId)
    const rows = resultRows(loaded.cups, loaded.set, { judge: id => loaded.names.get(id) ?? 'a former member' }, can.seeCompetitors(role, Boolean(loaded.signedOff)))
    const csv = Papa.unparse({ fields: [...resultColumns], data: rows.map(row => resultColumns.map(column => row[column])) })
    return { ...loaded, csv, rows: rows.length, filename: resultsFileName(loaded.event?.name ?? '', loaded.round.name) }
  }

  return {
    /** lead and owner any time; everyone in the team once the round is signed off. */
    async csv(teamId: string, roundId: string, userId: string): Promise<{ csv: string, filename: string }> {
      const role = await deps.teams.roleIn(teamId, userId)
      const result = await csvFor(teamId, roundId, role)
      if (!can.readResults(role, Boolean(result.signedOff)))
        throw new HttpError(403, 'forbidden', 'The results of this round open to the whole team once the head judge signs it off.')
      return { csv: result.csv, filename: result.filename }
    },

    /** Refuses (403) anyone in the team who may not send results; 404 outside it. */
    async checkSender(teamId: string, userId: string): Promise<void> {
      if (!can.sendResults(await deps.teams.roleIn(teamId, userId)))
        throw new HttpError(403, 'forbidden', 'Only a lead or an owner can send a round\'s results.')
    },

    /** The CSV to the organisers, after sign-off, by a lead or an owner; audit-logged. */
    async email(teamId: string, roundId: string, to: string, actor: { userId: string, ip?: string }): Promise<{ to: string, filename: string, rows: number }> {
      const role = await deps.teams.roleIn(teamId, actor.userId)
      if (!can.sendResults(role))
        throw new HttpError(403, 'forbidden', 'Only a lead or an owner can send a round\'s results.')
      const result = await csvFor(teamId, roundId, role)
      if (!result.signedOff)
        throw new HttpError(409, 'not_signed_off', 'This round is not signed off yet: its results can still change. Sign it off first.')
      const title = `${result.event?.name ?? 'Event'} · ${result.round.name}`
      const lines = result.cups.map(cup => `${cup.entry.code}  ${cup.entry.contestant || '(no name)'}  ${cup.summary.tds ? `${formatTds(cup.summary.tds.mean)} %TDS · ${formatYield(cup.summary.yield!.mean)} % EY` : 'not measured'}${cup.flag ? `  flagged: ${cup.flag}` : ''}`)
      try {
        await deps.mailer.send({
          to,
          subject: `Results: ${title}`,
          text: [`Results of ${title}, signed off ${result.signedOff.signedOffAt.slice(0, 16).replace('T', ' ')} UTC.`, `Zone: ${result.plan.zone.name}.`, '', ...lines, '', `Every pour and reading is in the attached ${result.filename}.`].join('\n'),
          attachments: [{ filename: result.filename, content: result.csv, contentType: 'text/csv; charset=utf-8' }],
        })
      }
      catch {
        throw new HttpError(503, 'mail_unavailable', 'The mail server did not take the message. Try again in a moment.')
      }
      await audit(db, { action: 'round.results_emailed', actorId: actor.userId, teamId, subjectId: roundId, ip: actor.ip, detail: { to, rows: result.rows } })
      return { to, filename: result.filename, rows: result.rows }
    },
  }
}

function teamZone(row: RecordRow | undefined) {
  if (!row)
    return undefined
  const data = row.data as EntityData<'zone'>
  try {
    return defineZone({ id: row.id, name: data.name, tdsPercent: data.tdsPercent, yieldPercent: data.yieldPercent, source: 'Team zone' })
  }
  catch (error) {
    if (error instanceof BrewingInputError)
      return undefined
    throw error
  }
}

export type ResultsService = ReturnType<typeof createResultsService>
