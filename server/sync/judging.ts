import type { EntityData } from '../../shared/schemas/entities'
import type { RecordBatch, StoredRow } from './store'
import { and, eq, inArray, isNull } from 'drizzle-orm'
import { normalizeCode } from '../../shared/records/blind-codes'
import { records } from '../db/schema'
import { audit } from '../services/audit.service'

// Competition rounds inside the push: signing one off (from the route or from a queued sign-off
// record, the same freeze either way) and keeping blind codes unique in their event.

/**
 * Freezes a round: its cups get a new rev first (so phones that were sent them without the
 * competitor's name pull them again, names and all), then the round is stamped with who signed it
 * off and when, in its history and in the audit log. The round's rev is the highest, so every cup,
 * brew and reading of it was written before it.
 */
export async function freezeRound(batch: RecordBatch, round: StoredRow<'round'>, by: { userId: string, ip?: string, via: 'route' | 'phone' }, nextRev: () => number): Promise<StoredRow<'round'>> {
  const stored = await batch.tx.select({ id: records.id }).from(records).where(and(eq(records.parentId, round.id), eq(records.entity, 'entry'), isNull(records.deletedAt)))
  const fresh = batch.created('entry').filter(row => row.data.roundId === round.id).map(row => row.id)
  const ids = [...new Set([...stored.map(row => row.id), ...fresh])]
  await batch.preload(ids)
  const at = new Date()
  for (const id of ids) {
    const entry = await batch.find('entry', id)
    if (entry && !entry.deletedAt && entry.data.roundId === round.id)
      batch.write({ ...entry, rev: nextRev(), updatedAt: at })
  }
  const rev = nextRev()
  const derived = { signedOffAt: at.toISOString(), signedOffBy: by.userId }
  const signed = batch.note({ ...round, derived, rev, updatedAt: at }, { rev, at: derived.signedOffAt, by: by.userId, op: 'edit', changes: { signedOffAt: { from: null, to: derived.signedOffAt } } })
  batch.write(signed)
  await audit(batch.tx, { action: 'round.signed_off', actorId: by.userId, teamId: round.teamId, subjectId: round.id, ip: by.ip, detail: { via: by.via, cups: ids.length } })
  return signed
}

/**
 * Why a cup's code cannot be used, or null: another live cup of the same event (any of its rounds,
 * this batch included) already has it, compared as the app writes codes.
 */
export async function codeClash(batch: RecordBatch, id: string, entry: EntityData<'entry'>): Promise<string | null> {
  const round = await batch.find('round', entry.roundId)
  if (!round)
    return null
  const rounds = await batch.tx.select({ id: records.id }).from(records).where(and(eq(records.parentId, round.data.eventId), eq(records.entity, 'round')))
  const roundIds = new Set([round.id, ...rounds.map(row => row.id), ...batch.created('round').filter(row => row.data.eventId === round.data.eventId).map(row => row.id)])
  const stored = await batch.tx.select({ id: records.id, data: records.data }).from(records).where(and(inArray(records.parentId, [...roundIds]), eq(records.entity, 'entry'), isNull(records.deletedAt)))
  const code = normalizeCode(entry.code)
  const others = [...stored.map(row => ({ id: row.id, code: String(row.data.code) })), ...batch.created('entry').filter(row => roundIds.has(row.data.roundId)).map(row => ({ id: row.id, code: row.data.code }))]
  const clash = others.find(other => other.id !== id && normalizeCode(other.code) === code)
  return clash ? `code: another cup of this event already has the code ${entry.code}; give this cup a new code.` : null
}
