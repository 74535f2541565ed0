import type { z } from 'zod'
import type { Health } from '../../shared/schemas/health'
import { ApiErrorBodySchema } from '../../shared/schemas/api-error'
import { HealthSchema } from '../../shared/schemas/health'

/** A failed API call: the server's error code and message, or `network` when nothing answered. */
export class ApiError extends Error {
  override name = 'ApiError'

  constructor(readonly status: number, readonly code: string, message: string) {
    super(message)
  }
}

/** Fetches a JSON endpoint and parses the answer with its shared schema; never trusts the shape. */
export async function apiGet<T extends z.ZodType>(path: string, schema: T, options: { okStatuses?: number[] } = {}): Promise<z.infer<T>> {
  let response: Response
  try {
    response = await fetch(`/api/v1${path}`, { headers: { Accept: 'application/json' }, credentials: 'same-origin' })
  }
  catch {
    throw new ApiError(0, 'network', 'The team server cannot be reached from this phone right now.')
  }
  const body: unknown = await response.json().catch(() => undefined)
  if (response.ok || options.okStatuses?.includes(response.status)) {
    const parsed = schema.safeParse(body)
    if (parsed.success)
      return parsed.data
    throw new ApiError(response.status, 'bad_response', 'The team server sent an answer this app does not understand.')
  }
  const error = ApiErrorBodySchema.safeParse(body)
  if (error.success)
    throw new ApiError(response.status, error.data.error.code, error.data.error.message)
  throw new ApiError(response.status, 'http_error', `The team server answered with status ${response.status}.`)
}

/** `GET /health`; a 503 still carries a health body (database down). */
export const fetchHealth = (): Promise<Health> => apiGet('/health', HealthSchema, { okStatuses: [503] })
