import type { LocalRecord } from './database'
import { db } from './database'

/** The team's brews on this phone, newest first, without the deleted ones. */
export async function brewsNewestFirst(teamId: string, limit?: number): Promise<LocalRecord<'brew'>[]> {
  let query = db.brews.where('[teamId+brewedAt]').between([teamId, ''], [teamId, '\uFFFF']).reverse().filter(brew => !brew.deletedAt)
  if (limit !== undefined)
    query = query.limit(limit)
  return query.toArray()
}
