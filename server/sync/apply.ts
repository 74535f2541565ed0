import type { z } from 'zod'
import type { Actor, RecordLookup } from '../../shared/records/rules'
import type { EntityData, EntityName } from '../../shared/schemas/entities'
import type { HistoryEntry } from '../../shared/schemas/records'
import type { Mutation, MutationResult } from '../../shared/schemas/sync'
import type { Touch } from './derive'
import type { RecordBatch, RecordRow } from './store'
import { BrewingInputError } from '../../shared/brewing'
import { recipeRefusal } from '../../shared/records/recipe-rules'
import { definitionOf } from '../../shared/records/registry'
import { frozenMessage, identityRefusal, refusalOf, roundIdOf } from '../../shared/records/rules'
import { entityDataSchemas } from '../../shared/schemas/entities'
import { deriveCalibration, rederive } from './derive'
import { codeClash, freezeRound } from './judging'
import { toRecord } from './store'

const same = (a: unknown, b: unknown): boolean => JSON.stringify(a ?? null) === JSON.stringify(b ?? null)
const isObject = (value: unknown): value is Record<string, unknown> => typeof value === 'object' && value !== null && !Array.isArray(value)

/** The first problem zod found, as `field: message`. */
export function describeIssue(error: z.ZodError): string {
  const issue = error.issues[0]
  return issue ? `${issue.path.join('.') || 'mutation'}: ${issue.message}` : 'The mutation is not valid.'
}

/** What applying one mutation needs: the batch, who sends it, the team's next rev, the brews to re-derive. */
export interface ApplyContext {
  batch: RecordBatch
  actor: Actor
  nextRev: () => number
  touched: Map<string, Touch>
}

/** Whether a signed-off round holds the record (before or after the change). */
async function frozen(batch: RecordBatch, entity: EntityName, id: string, ...versions: Record<string, unknown>[]): Promise<boolean> {
  const lookup: RecordLookup = async (e, recordId) => batch.find(e, recordId)
  for (const data of versions) {
    const roundId = await roundIdOf(entity, id, data, lookup)
    if (roundId && (await batch.find('round', roundId))?.derived)
      return true
  }
  return false
}

/** Who made the record that decides who may change this one: itself, or its parent (a reading's brew). */
async function authorOf(batch: RecordBatch, entity: EntityName, data: EntityData<EntityName>, current: RecordRow | undefined, userId: string): Promise<string | null> {
  const definition = definitionOf(entity)
  if (definition.governedBy === 'self')
    return current?.createdBy ?? null
  const parent = definition.parent(data)
  const row = parent ? await batch.find(parent.entity, parent.id) : undefined
  return row?.createdBy ?? userId
}

/**
 * Applies one well-formed mutation to the batch: refused with a reason the phone shows, a conflict
 * with the server's copy, or applied at a new rev. The rules come from shared/records/rules.ts.
 */
export async function applyMutation(ctx: ApplyContext, m: Mutation): Promise<MutationResult> {
  const { batch, actor } = ctx
  const rejected = (reason: string): MutationResult => ({ mutationId: m.mutationId, status: 'rejected', reason })
  const applied = (rev: number): MutationResult => ({ mutationId: m.mutationId, status: 'applied', rev })
  const stored = await batch.any(m.id)
  if (stored && stored.teamId !== m.teamId)
    return rejected('This record belongs to another team.')
  if (stored && stored.entity !== m.entity)
    return rejected(`This id already names a ${definitionOf(stored.entity).noun.one}, not a ${definitionOf(m.entity).noun.one}.`)
  const current = stored
  const conflict = (row: RecordRow): MutationResult => ({ mutationId: m.mutationId, status: 'conflict', rev: row.rev, server: toRecord(row) })
  const note = <R extends RecordRow>(row: R, op: HistoryEntry['op'], rev: number, changes: HistoryEntry['changes'] = {}): R =>
    batch.note(row, { rev, at: new Date().toISOString(), by: actor.userId, op, changes, ...(m.reason ? { reason: m.reason } : {}) })

  if (m.op === 'delete' || m.op === 'restore') {
    if (!current)
      return rejected('There is no such record on the server.')
    const authorId = await authorOf(batch, m.entity, current.data as EntityData<EntityName>, current, actor.userId)
    const refusal = refusalOf(actor, { entity: m.entity, op: m.op, authorId, reason: m.reason })
    if (refusal)
      return rejected(refusal)
    if (Boolean(current.deletedAt) === (m.op === 'delete'))
      return applied(current.rev)
    // A delete or restore of a copy the phone never had, or older than the server's, clashes.
    if (m.baseRev === null || m.baseRev !== current.rev)
      return conflict(current)
    if (await frozen(batch, m.entity, m.id, current.data))
      return rejected(frozenMessage)
    const rev = ctx.nextRev()
    batch.write(note({ ...current, deletedAt: m.op === 'delete' ? new Date() : null, updatedAt: new Date(), rev }, m.op, rev))
    return applied(rev)
  }

  if (!isObject(m.data))
    return rejected('data: a put needs the record\'s fields.')
  if (current?.deletedAt)
    return conflict(current)
  // An edit sends only the fields it changed; they are checked together with the server's copy.
  const parsed = entityDataSchemas[m.entity].safeParse(current ? { ...current.data, ...m.data } : m.data)
  if (!parsed.success)
    return rejected(describeIssue(parsed.error))
  const data = parsed.data
  const fields: Record<string, unknown> = data
  const authorId = await authorOf(batch, m.entity, data, current, actor.userId)
  const refusal = refusalOf(actor, { entity: m.entity, op: current ? 'edit' : 'create', authorId, reason: m.reason }) ?? identityRefusal(m.entity, m.id, fields, current?.createdBy ?? actor.userId)
  if (refusal)
    return rejected(refusal)
  const changed = current ? Object.keys(m.data).filter(key => key in fields && !same(fields[key], current.data[key])) : Object.keys(fields)
  if (current) {
    if (changed.length === 0)
      return applied(current.rev)
    // Edits of different fields merge; a field changed on the server since the phone's copy clashes,
    // and so does a copy the server never had or one that claims a rev the server has not reached.
    if (m.baseRev === null || m.baseRev > current.rev || changed.some(key => (current.fieldRevs[key] ?? 0) > m.baseRev!))
      return conflict(current)
  }
  const definition = definitionOf(m.entity)
  for (const link of definition.links(data)) {
    const parent = await batch.find(link.entity, link.id)
    if (!parent || parent.teamId !== m.teamId || parent.deletedAt)
      return rejected(`The ${definitionOf(link.entity).noun.one} this record belongs to is not on the server.`)
  }
  if (m.entity === 'signoff' && !current)
    return signOff(ctx, m, data as EntityData<'signoff'>)
  const inTeam: RecordLookup = async (entity, id) => {
    const row = await batch.find(entity, id)
    return row && row.teamId === m.teamId && !row.deletedAt ? row : undefined
  }
  const inconsistent = await recipeRefusal(m.entity, m.id, data, current?.data as EntityData<EntityName> | undefined, inTeam)
  if (inconsistent)
    return rejected(inconsistent)
  if (await frozen(batch, m.entity, m.id, fields, ...(current ? [current.data] : [])))
    return rejected(frozenMessage)
  if (m.entity === 'entry' && (changed.includes('code') || changed.includes('roundId'))) {
    // The entity is an entry, so its data passed the entry schema.
    const clash = await codeClash(batch, m.id, data as EntityData<'entry'>)
    if (clash)
      return rejected(clash)
  }

  let derived = current?.derived ?? null
  if (m.entity === 'calibration') {
    try {
      // The entity is a calibration, so its data passed the calibration schema.
      derived = deriveCalibration(data as EntityData<'calibration'>)
    }
    catch (error) {
      if (error instanceof BrewingInputError)
        return rejected(`points: ${error.message}`)
      throw error
    }
  }
  const rev = ctx.nextRev()
  const now = new Date()
  const fieldRevs = { ...current?.fieldRevs, ...Object.fromEntries(changed.map(key => [key, rev])) }
  const columns = { data, derived, fieldRevs, rev, updatedAt: now, parentId: definition.parent(data)?.id ?? null }
  if (current)
    batch.write(note({ ...current, ...columns }, 'edit', rev, Object.fromEntries(changed.map(key => [key, { from: current.data[key] ?? null, to: fields[key] ?? null }]))))
  else
    batch.write({ id: m.id, entity: m.entity, teamId: m.teamId, createdBy: actor.userId, createdAt: now, deletedAt: null, history: null, historyCount: 0, ...columns })
  if (m.entity === 'brew')
    ctx.touched.set(m.id, { ...ctx.touched.get(m.id), rev, by: actor.userId })
  else if (m.entity === 'reading')
    ctx.touched.set(String(fields.brewId), { rev: null, by: actor.userId, ...ctx.touched.get(String(fields.brewId)) })
  return applied(rev)
}

/**
 * A sign-off queued on a phone: kept as a record, then the round freezes as the sign-off route
 * freezes it. One that arrives for a round already signed off (from another phone, or the route)
 * is answered applied and changes nothing.
 */
async function signOff(ctx: ApplyContext, m: Mutation, data: EntityData<'signoff'>): Promise<MutationResult> {
  const { batch, actor } = ctx
  const round = (await batch.find('round', data.roundId))!
  if (round.derived)
    return { mutationId: m.mutationId, status: 'applied', rev: round.rev }
  // Pours and readings that came before it in this push are worked out first, so nothing of the
  // round gets a rev after the round's own.
  await rederive(batch, ctx.touched, ctx.nextRev)
  ctx.touched.clear()
  const rev = ctx.nextRev()
  const now = new Date()
  const fieldRevs = Object.fromEntries(Object.keys(data).map(key => [key, rev]))
  batch.write({ id: m.id, entity: 'signoff', teamId: m.teamId, createdBy: actor.userId, createdAt: now, updatedAt: now, deletedAt: null, history: null, historyCount: 0, data, derived: null, fieldRevs, rev, parentId: round.id })
  await freezeRound(batch, round, { userId: actor.userId, via: 'phone' }, ctx.nextRev)
  return { mutationId: m.mutationId, status: 'applied', rev }
}
