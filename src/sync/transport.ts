import type { SyncTransport } from './engine'
import { PullResponseSchema, PushResponseSchema } from '../../shared/schemas/sync'
import { api } from '../api/client'

/** The engine's transport over the API client: its ApiError carries the status the engine reads. */
export const apiTransport: SyncTransport = {
  push: body => api('POST', '/sync/push', { body, schema: PushResponseSchema }),
  pull: (teamId, since, limit) => api('GET', `/sync/pull?${new URLSearchParams({ teamId, since: String(since), limit: String(limit) })}`, { schema: PullResponseSchema }),
}
