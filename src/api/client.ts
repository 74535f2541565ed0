import type { z } from 'zod'
import type { AuthResponse } from '../../shared/schemas/auth'
import type { Health } from '../../shared/schemas/health'
import { ApiErrorBodySchema } from '../../shared/schemas/api-error'
import { AuthResponseSchema } from '../../shared/schemas/auth'
import { HealthSchema } from '../../shared/schemas/health'
import { ApiError } from './errors'

export { ApiError }

// The access token lives only in memory: never in localStorage or IndexedDB.
let accessToken: string | null = null
let refreshing: Promise<AuthResponse | null> | null = null
let onSessionEnded: (() => void) | null = null

export function setAccessToken(token: string | null): void {
  accessToken = token
}
export const hasAccessToken = (): boolean => accessToken !== null
/** The access token for a request the API client does not make itself (an upload with progress). */
export const currentAccessToken = (): string | null => accessToken
/** Called when the refresh cookie no longer gives a session (the user must sign in again). */
export function whenSessionEnds(handler: () => void): void {
  onSessionEnded = handler
}

interface RequestOptions<T extends z.ZodType> {
  body?: unknown
  schema?: T
  okStatuses?: number[]
  /** Retry once after refreshing the session on a 401 (default for every call but auth's own). */
  retry?: boolean
}

async function send(method: string, path: string, body: unknown): Promise<Response> {
  const headers: Record<string, string> = { Accept: 'application/json' }
  if (body !== undefined)
    headers['Content-Type'] = 'application/json'
  if (accessToken)
    headers.Authorization = `Bearer ${accessToken}`
  try {
    return await fetch(`/api/v1${path}`, { method, headers, credentials: 'same-origin', body: body === undefined ? undefined : JSON.stringify(body) })
  }
  catch {
    throw new ApiError(0, 'network', 'The team server cannot be reached from this phone right now.')
  }
}

/** Calls the API and parses the answer with its shared schema; never trusts the shape. */
export async function api<T extends z.ZodType>(method: string, path: string, options: RequestOptions<T> = {}): Promise<z.infer<T>> {
  let response = await send(method, path, options.body)
  if (response.status === 401 && (options.retry ?? !path.startsWith('/auth/')) && (await refreshSession()))
    response = await send(method, path, options.body)
  const body: unknown = response.status === 204 ? undefined : await response.json().catch(() => undefined)
  if (response.ok || options.okStatuses?.includes(response.status)) {
    if (!options.schema)
      return undefined as z.infer<T>
    const parsed = options.schema.safeParse(body)
    if (parsed.success)
      return parsed.data
    throw new ApiError(response.status, 'bad_response', 'The team server sent an answer this app does not understand.')
  }
  const error = ApiErrorBodySchema.safeParse(body)
  if (error.success)
    throw new ApiError(response.status, error.data.error.code, error.data.error.message, error.data.error.issues)
  throw new ApiError(response.status, 'http_error', `The team server answered with status ${response.status}.`)
}

/** Calls the API for a text answer (a CSV file); a refusal throws ApiError as api() does. */
export async function apiText(path: string): Promise<string> {
  let response = await send('GET', path, undefined)
  if (response.status === 401 && (await refreshSession()))
    response = await send('GET', path, undefined)
  if (response.ok)
    return response.text()
  const error = ApiErrorBodySchema.safeParse(await response.json().catch(() => undefined))
  throw error.success ? new ApiError(response.status, error.data.error.code, error.data.error.message) : new ApiError(response.status, 'http_error', `The team server answered with status ${response.status}.`)
}

/**
 * Trades the refresh cookie for a new access token, once at a time however many calls ask.
 * Resolves null when the server says the session is over; throws ApiError `network` when offline.
 */
export function refreshSession(): Promise<AuthResponse | null> {
  refreshing ??= api('POST', '/auth/refresh', { schema: AuthResponseSchema, retry: false })
    .then((session) => {
      setAccessToken(session.accessToken)
      return session
    }, (error: unknown) => {
      if (error instanceof ApiError && error.status === 401) {
        setAccessToken(null)
        onSessionEnded?.()
        return null
      }
      throw error
    })
    .finally(() => {
      refreshing = null
    })
  return refreshing
}

/** `GET /health`; a 503 still carries a health body (database down). */
export const fetchHealth = (): Promise<Health> => api('GET', '/health', { schema: HealthSchema, okStatuses: [503] })
