import type { Role } from '../schemas/auth'
import type { EntityData, EntityName } from '../schemas/entities'
import { v5 as uuidv5 } from 'uuid'
import { definitionOf } from './registry'

// Who may do what (DESIGN.md), in one place: the server enforces these rules on every route and
// every pushed change; the phone uses them only to hint (hide a button, ask for a reason early).

/** Team settings and people. */
export const can = {
  editTeam: (role: Role) => role === 'owner',
  manageMembers: (role: Role) => role === 'owner',
  invite: (role: Role, invitedRole: Role) => role === 'owner' || (role === 'lead' && (invitedRole === 'member' || invitedRole === 'viewer')),
  seeInvitations: (role: Role) => role === 'owner' || role === 'lead',
  signOff: (role: Role) => role === 'owner' || role === 'lead',
  /**
   * Blind judging: a cup's competitor is known to the head judge (a lead or an owner) and to everyone
   * else only once the round is signed off. The server leaves the name out of all it sends otherwise.
   */
  seeCompetitors: (role: Role, signedOff: boolean) => role === 'owner' || role === 'lead' || signedOff,
  /** A round's results: the head judge any time, the whole team once it is signed off. */
  readResults: (role: Role, signedOff: boolean) => role === 'owner' || role === 'lead' || signedOff,
  sendResults: (role: Role) => role === 'owner' || role === 'lead',
  /** Photos and other files go with the records a person may write: not for viewers. */
  uploadFiles: (role: Role) => role !== 'viewer',
}

export interface Actor { userId: string, role: Role }

/** A change to a record, as the rules see it. */
export interface RecordChange {
  entity: EntityName
  op: 'create' | 'edit' | 'delete' | 'restore'
  /**
   * Who made the record that governs this one: the record itself, or for a reading its brew. Null
   * for a new record that governs itself.
   */
  authorId: string | null
  reason?: string
}

/** Whether a lead or owner must give a reason for this change (a teammate's brew). */
export function reasonRequired(actor: Actor, change: Omit<RecordChange, 'reason'>): boolean {
  const definition = definitionOf(change.entity)
  return definition.reasonForTeammate && change.authorId !== null && change.authorId !== actor.userId && (actor.role === 'owner' || actor.role === 'lead')
}

/** Why the actor may not make this change, or null when they may. */
export function refusalOf(actor: Actor, change: RecordChange): string | null {
  const definition = definitionOf(change.entity)
  if (actor.role === 'viewer')
    return 'Viewers can read the team\'s records but not change them.'
  if (definition.writers === 'lead' && actor.role === 'member')
    return `Only a lead or an owner can set up or change ${definition.noun.many}.`
  if (definition.appendOnly && change.op !== 'create') {
    const noun = definition.noun.many.charAt(0).toUpperCase() + definition.noun.many.slice(1)
    return change.op === 'edit' ? `${noun} cannot be changed once recorded; add a new one instead.` : `${noun} are kept as recorded and cannot be deleted.`
  }
  const teammate = change.authorId !== null && change.authorId !== actor.userId
  if (teammate && actor.role === 'member') {
    return definition.governedBy === 'parent'
      ? `Members can add ${definition.noun.many} only to their own ${definition.partOf ?? 'brews'}; ask a lead to correct this one.`
      : 'Members can change only the records they made; ask a lead to correct this one.'
  }
  if (reasonRequired(actor, change) && !change.reason?.trim())
    return `reason: say why you change ${definition.governedBy === 'parent' ? 'a brew' : `a ${definition.noun.one}`} a teammate recorded; the reason stays in its history.`
  return null
}

/** Whether the phone should offer to make a record of this entity (the server decides for good). */
export function mayCreate(actor: Actor | null, entity: EntityName): boolean {
  return actor !== null && refusalOf(actor, { entity, op: 'create', authorId: null }) === null
}

/** Whether the phone should offer to change a record at all (the server decides for good). */
export function mayChange(actor: Actor | null, entity: EntityName, authorId: string): boolean {
  return actor !== null && refusalOf(actor, { entity, op: 'edit', authorId, reason: 'hint' }) === null
}

export const frozenMessage = 'This round is signed off: its results can no longer change. Ask the head judge if a correction is needed.'

/** Reads a record's data by entity and id: the server's batch or the phone's store. */
export type RecordLookup = <E extends EntityName>(entity: E, id: string) => Promise<{ data: EntityData<E> } | undefined>

/**
 * The round a record sits in: the round itself, an entry's or a sign-off's round, a brew's through the entry it
 * was measured for, a reading's through its brew. A signed-off round freezes all of them, so a
 * change is checked against the round of the record before and after it (a move out is a change).
 */
export async function roundIdOf(entity: EntityName, id: string, data: Record<string, unknown>, lookup: RecordLookup): Promise<string | null> {
  if (entity === 'round')
    return id
  if (entity === 'entry' || entity === 'signoff')
    return typeof data.roundId === 'string' ? data.roundId : null
  let context = entity === 'brew' ? data.context : undefined
  if (entity === 'reading' && typeof data.brewId === 'string')
    context = (await lookup('brew', data.brewId))?.data.context
  const { kind, refId } = (context ?? {}) as { kind?: string, refId?: string | null }
  if (kind !== 'entry' || !refId)
    return null
  return (await lookup('entry', refId))?.data.roundId ?? null
}

// A fixed namespace for the ids of scores (a UUID v5 needs one); never change it.
const scoreNamespace = '6f1d7c52-3a8e-4b0f-9c41-2d5e8a7b9c10'

/**
 * The id of a taster's score of a lot on a cupping table: the same on every phone, so one taster
 * has one score per lot per table, and a second phone's copy meets the first as an edit.
 */
export function scoreIdOf(tableId: string, lotId: string, tasterId: string): string {
  return uuidv5(`${tableId.toLowerCase()}/${lotId.toLowerCase()}/${tasterId.toLowerCase()}`, scoreNamespace)
}

/** Why a new record cannot have this id, or null: a score's id must come from its table, lot and taster. */
export function identityRefusal(entity: EntityName, id: string, data: Record<string, unknown>, authorId: string): string | null {
  if (entity !== 'score' || typeof data.tableId !== 'string' || typeof data.lotId !== 'string')
    return null
  return id.toLowerCase() === scoreIdOf(data.tableId, data.lotId, authorId)
    ? null
    : 'A taster keeps one score per lot on a table: this score\'s id does not come from its table, lot and taster.'
}
