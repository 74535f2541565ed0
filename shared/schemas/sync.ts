import { z } from 'zod'
import { EntityNameSchema } from './entities'
import { freeText, IdSchema } from './primitives'

export const MutationSchema = z.strictObject({
  mutationId: IdSchema,
  entity: EntityNameSchema,
  /** put: create or edit; delete: leave a tombstone; restore: bring a tombstoned record back. */
  op: z.enum(['put', 'delete', 'restore']),
  id: IdSchema,
  teamId: IdSchema,
  /** Every field of a new record; only the changed fields of an edit. */
  data: z.record(z.string(), z.unknown()).optional(),
  /** The server rev the phone's copy was based on; null for a record new on the phone. */
  baseRev: z.number().int().nonnegative().nullable(),
  /** Why a record was changed or deleted; a teammate's brew is only corrected with one. */
  reason: freeText(500).optional(),
})
export type Mutation = z.infer<typeof MutationSchema>

export const maxMutationsPerPush = 200

export const PushBodySchema = z.strictObject({
  clientId: IdSchema,
  // Each mutation is checked on its own so one bad one does not sink the batch.
  mutations: z.array(z.unknown()).min(1, 'must hold at least one mutation').max(maxMutationsPerPush, `must hold at most ${maxMutationsPerPush} mutations`),
})

export const MutationResultSchema = z.object({
  mutationId: z.string(),
  status: z.enum(['applied', 'conflict', 'rejected']),
  rev: z.number().int().optional(),
  reason: z.string().optional(),
  /** The server's copy of the record, for a conflict. */
  server: z.record(z.string(), z.unknown()).optional(),
})
export type MutationResult = z.infer<typeof MutationResultSchema>
export const PushResponseSchema = z.object({ results: z.array(MutationResultSchema) })

/** Changes per pull page a phone asks for: a new phone's first sync takes the team in pages this size. */
export const pullPageSize = 1000
/** The largest page a pull answers (a page of brews is about 300 bytes of JSON a record). */
export const maxPullLimit = 2000

export const PullQuerySchema = z.object({
  teamId: IdSchema,
  since: z.coerce.number().int().nonnegative().default(0),
  limit: z.coerce.number().int().min(1).max(maxPullLimit).default(500),
})
// Any entity name: a phone skips kinds of records a newer server has and this version does not know.
export const ChangeSchema = z.object({ entity: z.string(), id: z.string(), rev: z.number().int(), op: z.enum(['put', 'delete']), data: z.record(z.string(), z.unknown()) })
export type Change = z.infer<typeof ChangeSchema>
export const PullResponseSchema = z.object({
  changes: z.array(ChangeSchema),
  cursor: z.number().int(),
  hasMore: z.boolean(),
  /** Changes after this page (for progress); optional, as a server older than this does not send it. */
  remaining: z.number().int().nonnegative().optional(),
})
export type PullResponse = z.infer<typeof PullResponseSchema>
