import type { Connection } from 'mysql2/promise'
import type { EntityName } from '../../shared/schemas/entities'
import type { HistoryEntry } from '../../shared/schemas/records'
import { hashPassword } from '../../server/services/passwords'

// What a database of the release before migration 0004 held: one table per entity (0002, 0003),
// written the way that release's push wrote them (one counter per team across every table, history
// inline, a round's sign-off in its own columns). The rows follow that release's demo team.

/** A fixed id for the fixture's n-th row, so the test can name each record. */
export const oid = (n: number): string => `0190a8c4-0000-7000-8000-${String(n).padStart(12, '0')}`

export const teamId = oid(1)
/** A team made before its first push: the old release made its counter row only then. */
export const quietTeamId = oid(2)
export const people = { owner: oid(3), lead: oid(4), member: oid(5) }
export const oldPassword = 'kestrel-demo-2026'

/** An old record: its table, the entity it becomes, its envelope and its reference columns. */
export interface OldRecord {
  table: string
  entity: EntityName
  id: string
  rev: number
  createdBy: string
  data: Record<string, unknown>
  derived?: Record<string, unknown> | null
  fieldRevs?: Record<string, number>
  history?: HistoryEntry[]
  deletedAt?: string | null
  /** The old table's own columns (instrument_id, context_ref_id, brew_id, ...). */
  refs?: Record<string, string | null>
  /** What `parent_id` must hold afterwards. */
  parent: string | null
}

const at = (minutes: number): string => new Date(Date.UTC(2026, 10, 20, 8, minutes)).toISOString()
const edit = (rev: number, by: string, changes: HistoryEntry['changes'], reason?: string): HistoryEntry => ({ rev, at: at(rev), by, op: 'edit', changes, ...(reason ? { reason } : {}) })

const ids = {
  prism: oid(10),
  pen: oid(11),
  line: oid(12),
  recipe: oid(13),
  trip: oid(14),
  alder: oid(15),
  copperbeck: oid(16),
  event: oid(17),
  heat: oid(18),
  k1: oid(19),
  k2: oid(20),
  zone: oid(21),
  quick: oid(30),
  cup: oid(31),
  bowl: oid(32),
  corrected: oid(33),
  dropped: oid(34),
}
export const fixtureIds = ids

function reading(id: number, brewId: string, rev: number, value: number, kind = 'tds'): OldRecord {
  return {
    table: 'readings',
    entity: 'reading',
    id: oid(id),
    rev,
    createdBy: people.member,
    refs: { brew_id: brewId },
    parent: brewId,
    data: { brewId, value, kind, temperatureC: null, instrumentId: kind === 'tds' ? ids.pen : ids.prism, calibrationId: kind === 'nD' ? ids.line : null, takenAt: at(rev) },
  }
}
function brewData(extra: Record<string, unknown>) {
  return {
    context: { kind: 'quick', refId: null },
    method: 'percolation',
    instrumentId: ids.pen,
    calibrationId: null,
    strengthSource: 'direct',
    brixFactor: null,
    dose: 15,
    doseGross: null,
    doseTare: null,
    beverageMass: 236,
    beverageGross: null,
    beverageTare: null,
    waterMass: null,
    retainedRatio: null,
    grindSetting: '22 clicks',
    contactTimeSeconds: 205,
    waterTemperatureC: 94,
    notes: '',
    brewedAt: at(30),
    excludedReadingIds: [],
    ...extra,
  }
}
/** Twenty-five edits of one note: more than the 20 a record carries, so the cap is tested. */
const noteEdits = Array.from({ length: 25 }, (_, i) => edit(60 + i, people.lead, { notes: { from: i ? `take ${i}` : '', to: `take ${i + 1}` } }))

export const oldRecords: OldRecord[] = [
  { table: 'instruments', entity: 'instrument', id: ids.prism, rev: 1, createdBy: people.owner, parent: null, data: { label: 'Quayside prism', readingKind: 'nD', resolution: 0.00001, repeatability: 0.00002, brixFactor: null, notes: 'Bench refractometer.' } },
  { table: 'instruments', entity: 'instrument', id: ids.pen, rev: 40, createdBy: people.owner, parent: null, fieldRevs: { label: 40 }, data: { label: 'Bar pen (new battery)', readingKind: 'tds', resolution: 0.01, repeatability: 0.02, brixFactor: null, notes: '' }, history: [edit(40, people.owner, { label: { from: 'Bar pen', to: 'Bar pen (new battery)' } })] },
  {
    table: 'calibrations',
    entity: 'calibration',
    id: ids.line,
    rev: 3,
    createdBy: people.owner,
    refs: { instrument_id: ids.prism },
    parent: ids.prism,
    data: { instrumentId: ids.prism, standardUnit: 'brix', points: [{ concentration: 0, reading: 1.333 }, { concentration: 1, reading: 1.33442 }, { concentration: 2, reading: 1.33587 }], zeroReading: 1.333, temperatureC: 20, active: true, calibratedAt: at(3), notes: '' },
    derived: { fit: { slope: 0.001435, intercept: 1.332995, n: 3, rSquared: 0.99998, residualSd: 0.0000082, slopeSe: 0.0000058, interceptSe: 0.0000075, meanConcentration: 1, meanReading: 1.334430, sxx: 2, degreesOfFreedom: 1 } },
  },
  { table: 'recipes', entity: 'recipe', id: ids.recipe, rev: 4, createdBy: people.owner, parent: null, data: { name: 'House filter', method: 'percolation', dose: 15, waterMass: 250, targetTdsPercent: 1.3, targetYieldPercent: 20.5, grindSetting: '22 clicks', contactTimeSeconds: 210, waterTemperatureC: 94, notes: 'Paper filter, 40 s bloom.' } },
  { table: 'trips', entity: 'trip', id: ids.trip, rev: 5, createdBy: people.owner, parent: null, data: { name: 'North Terraces buying trip', origin: 'North Terraces', startsOn: '2026-11-10', endsOn: '2026-11-17', notes: '' } },
  { table: 'lots', entity: 'lot', id: ids.alder, rev: 6, createdBy: people.owner, refs: { trip_id: ids.trip }, parent: ids.trip, data: { tripId: ids.trip, farm: 'Alder Ridge Estate', region: 'North Terraces', variety: 'Typica', process: 'washed', moisturePercent: 10.8, lotSizeKg: 1380, askingPrice: 7.4, currency: 'EUR', notes: '' } },
  { table: 'lots', entity: 'lot', id: ids.copperbeck, rev: 7, createdBy: people.owner, refs: { trip_id: ids.trip }, parent: ids.trip, data: { tripId: ids.trip, farm: 'Copperbeck Farm', region: 'South Valley', variety: 'Bourbon', process: 'natural', moisturePercent: 11.4, lotSizeKg: 690, askingPrice: 8.1, currency: 'EUR', notes: '' } },
  { table: 'events', entity: 'event', id: ids.event, rev: 8, createdBy: people.owner, parent: null, data: { name: 'Kestrel Quay Brewers Open', venue: 'Net Loft Hall', startsOn: '2026-11-19', endsOn: '2026-11-19', zoneId: 'european-drip' } },
  // Signed off at rev 50: the old release kept who and when in the round's own columns.
  { table: 'rounds', entity: 'round', id: ids.heat, rev: 50, createdBy: people.owner, refs: { event_id: ids.event, signed_off_at: '2026-11-20 09:50:00.123', signed_off_by: people.lead }, parent: ids.event, data: { eventId: ids.event, name: 'Heat 1', position: 1, toleranceTdsPercent: 0.1, toleranceYieldPercent: 1 } },
  { table: 'entries', entity: 'entry', id: ids.k1, rev: 10, createdBy: people.owner, refs: { round_id: ids.heat }, parent: ids.heat, data: { roundId: ids.heat, code: 'K1', contestant: 'Wren Astley', notes: '' } },
  { table: 'entries', entity: 'entry', id: ids.k2, rev: 11, createdBy: people.owner, refs: { round_id: ids.heat }, parent: ids.heat, data: { roundId: ids.heat, code: 'K2', contestant: '', notes: 'Late to the bar' } },
  { table: 'zones', entity: 'zone', id: ids.zone, rev: 41, createdBy: people.lead, parent: null, fieldRevs: { notes: 41 }, data: { name: 'Quay house zone', tdsPercent: { min: 1.25, max: 1.4 }, yieldPercent: { min: 19, max: 21.5 }, notes: 'For the V60 bar' }, history: [edit(41, people.lead, { notes: { from: '', to: 'For the V60 bar' } })] },
  { table: 'brews', entity: 'brew', id: ids.quick, rev: 20, createdBy: people.member, refs: { context_ref_id: null, calibration_id: null }, parent: null, data: brewData({ notes: 'V60, 40 s bloom' }), derived: { tdsPercent: 1.32, yieldPercent: 20.77 } },
  reading(22, ids.quick, 21, 1.31),
  reading(23, ids.quick, 22, 1.33),
  {
    table: 'brews',
    entity: 'brew',
    id: ids.cup,
    rev: 23,
    createdBy: people.owner,
    refs: { context_ref_id: ids.k1, calibration_id: null },
    parent: ids.k1,
    data: brewData({ context: { kind: 'entry', refId: ids.k1 }, dose: null, doseGross: 28.5, doseTare: 12.5, beverageMass: null, beverageGross: 662.6, beverageTare: 412.6 }),
    derived: { tdsPercent: 1.38, yieldPercent: 21.56 },
  },
  reading(24, ids.cup, 24, 1.38),
  {
    table: 'brews',
    entity: 'brew',
    id: ids.bowl,
    rev: 25,
    createdBy: people.lead,
    refs: { context_ref_id: ids.alder, calibration_id: ids.line },
    parent: ids.alder,
    data: brewData({ context: { kind: 'lot', refId: ids.alder }, method: 'immersion', instrumentId: ids.prism, calibrationId: ids.line, strengthSource: 'calibration', brixFactor: 0.85, dose: 8.25, beverageMass: null, waterMass: 150, grindSetting: 'cupping' }),
    derived: { tdsPercent: 1.12, yieldPercent: 20.6 },
  },
  reading(26, ids.bowl, 26, 1.33461, 'nD'),
  // A teammate's brew corrected with a reason: the edit and the result it moved share one entry.
  {
    table: 'brews',
    entity: 'brew',
    id: ids.corrected,
    rev: 84,
    createdBy: people.member,
    refs: { context_ref_id: ids.recipe, calibration_id: null },
    parent: ids.recipe,
    fieldRevs: { beverageMass: 45, notes: 84 },
    data: brewData({ context: { kind: 'recipe', refId: ids.recipe }, beverageMass: 246, notes: 'take 25' }),
    derived: { tdsPercent: 1.36, yieldPercent: 22.3 },
    history: [edit(45, people.lead, { beverageMass: { from: 236, to: 246 }, result: { from: { tdsPercent: 1.36, yieldPercent: 21.4 }, to: { tdsPercent: 1.36, yieldPercent: 22.3 } } }, 'Scale read before the drip-through ended'), ...noteEdits],
  },
  reading(28, ids.corrected, 28, 1.36),
  { table: 'brews', entity: 'brew', id: ids.dropped, rev: 90, createdBy: people.member, refs: { context_ref_id: null, calibration_id: null }, parent: null, deletedAt: '2026-11-20 09:30:00.000', data: brewData({ notes: 'Wrong jug' }), derived: { tdsPercent: null, yieldPercent: null, missing: ['readings'] }, history: [{ rev: 90, at: at(90), by: people.member, op: 'delete', changes: {} }] },
]

export const lastRev = 90
/** Answers the old release kept for deliveries, keyed by phone and mutation only. */
export const oldAnswers = [{ clientId: oid(100), mutationId: oid(101), userId: people.owner, result: { mutationId: oid(101), status: 'applied', rev: 1 } }]

const sqlTime = (value: string): string => value.replace('T', ' ').replace('Z', '')

/** Writes the old release's rows into a database at migration 0003. */
export async function writeOldRelease(connection: Connection): Promise<void> {
  const passwordHash = await hashPassword(oldPassword)
  await connection.query('INSERT INTO teams (id, name) VALUES (?, ?), (?, ?)', [teamId, 'Kestrel Quay Tasting Crew', quietTeamId, 'Saltmarsh Night Market'])
  for (const [role, userId] of Object.entries(people)) {
    await connection.query('INSERT INTO users (id, email, name, password_hash) VALUES (?, ?, ?, ?)', [userId, `${role}@kestrel-quay.test`, `Old ${role}`, passwordHash])
    await connection.query('INSERT INTO memberships (team_id, user_id, role) VALUES (?, ?, ?)', [teamId, userId, role])
  }
  await connection.query('INSERT INTO memberships (team_id, user_id, role) VALUES (?, ?, ?)', [quietTeamId, people.owner, 'owner'])
  await connection.query('INSERT INTO team_sync_state (team_id, last_rev) VALUES (?, ?)', [teamId, lastRev])
  for (const r of oldRecords) {
    const refs = r.refs ?? {}
    const columns = ['id', 'team_id', 'created_by', 'created_at', 'updated_at', 'rev', 'deleted_at', 'data', 'derived', 'field_revs', 'history', ...Object.keys(refs)]
    const values = [r.id, teamId, r.createdBy, sqlTime(at(r.rev % 60)), sqlTime(at(r.rev)), r.rev, r.deletedAt ?? null, JSON.stringify(r.data), r.derived ? JSON.stringify(r.derived) : null, JSON.stringify(r.fieldRevs ?? {}), r.history ? JSON.stringify(r.history) : null, ...Object.values(refs)]
    await connection.query(`INSERT INTO ${r.table} (${columns.join(', ')}) VALUES (${columns.map(() => '?').join(', ')})`, values)
  }
  for (const answer of oldAnswers)
    await connection.query('INSERT INTO sync_mutations (client_id, mutation_id, user_id, result) VALUES (?, ?, ?, ?)', [answer.clientId, answer.mutationId, answer.userId, JSON.stringify(answer.result)])
  await connection.query('INSERT INTO audit_log (action, actor_id, team_id, detail, ip) VALUES (?, ?, ?, ?, ?), (?, ?, ?, ?, ?)', ['auth.login', people.owner, null, JSON.stringify({ ok: true }), '127.0.0.1', 'membership.role_changed', people.owner, teamId, JSON.stringify({ from: 'member', to: 'lead' }), '127.0.0.1'])
}

export { at as fixtureTime, sqlTime }
