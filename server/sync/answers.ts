import type { MutationResult } from '../../shared/schemas/sync'
import type { Tx } from './store'
import { and, eq, inArray } from 'drizzle-orm'
import { syncMutations } from '../db/schema'

/**
 * The answers already given to these mutations of one phone, by mutation id. Keyed by the person
 * too: an answer may hold a record, so it is only ever repeated to whoever sent the mutation.
 */
export async function storedAnswers(tx: Tx, userId: string, clientId: string, mutationIds: string[]): Promise<Map<string, MutationResult>> {
  if (mutationIds.length === 0)
    return new Map()
  const rows = await tx.select().from(syncMutations).where(and(eq(syncMutations.userId, userId), eq(syncMutations.clientId, clientId), inArray(syncMutations.mutationId, mutationIds)))
  // Stored by this module from a MutationResult.
  return new Map(rows.map(row => [row.mutationId, row.result as MutationResult]))
}

/** Keeps the answers given in this push, 500 rows per insert at most. */
export async function keepAnswers(tx: Tx, userId: string, clientId: string, answers: MutationResult[]): Promise<void> {
  for (let i = 0; i < answers.length; i += 500)
    await tx.insert(syncMutations).values(answers.slice(i, i + 500).map(result => ({ userId, clientId, mutationId: result.mutationId, result })))
}
