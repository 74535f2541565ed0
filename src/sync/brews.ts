import type { LixiviaDatabase } from '../db/database'
import { saveRecord } from './outbox'

export interface BrewSave {
  teamId: string
  userId: string
  /** An existing brew to edit; a new one otherwise. */
  id?: string
  data: Record<string, unknown>
  /** Readings typed for it that are not stored yet (without brewId: it is filled in here). */
  readings: Record<string, unknown>[]
  /** Strength and yield as the phone computed them, shown until the server's own arrive. */
  derived: { tdsPercent: number, yieldPercent: number }
  reason?: string
}

/**
 * A brew and its new readings go to the phone's store and the outbox together, at once, offline
 * or not: all of it is saved or none.
 * @returns the brew's id
 */
export async function saveBrew(database: LixiviaDatabase, save: BrewSave): Promise<string> {
  const { teamId, userId } = save
  return database.transaction('rw', database.brews, database.readings, database.outbox, async () => {
    const brewId = await saveRecord(database, 'brew', { teamId, userId, id: save.id, data: save.data, reason: save.reason })
    for (const reading of save.readings)
      await saveRecord(database, 'reading', { teamId, userId, data: { ...reading, brewId } })
    await database.brews.update(brewId, { derived: save.derived })
    return brewId
  })
}
