import { z } from 'zod'

/** The one error shape of every API response with a 4xx or 5xx status. */
export const ApiErrorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    issues: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
  }),
})

export type ApiErrorBody = z.infer<typeof ApiErrorBodySchema>
