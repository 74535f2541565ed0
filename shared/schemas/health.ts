import { z } from 'zod'

/** `GET /api/v1/health`: 200 when the database answers, 503 when it does not. */
export const HealthSchema = z.object({
  status: z.enum(['ok', 'unavailable']),
  db: z.enum(['up', 'down']),
  version: z.string(),
})

export type Health = z.infer<typeof HealthSchema>
