import type { EntityDerived } from '../../shared/schemas/records'
import type { LixiviaDatabase } from '../db/database'
import type { BrewFields, NewReading } from '../forms/brewRecord'
import { v7 as uuidv7 } from 'uuid'
import { saveRecord } from './outbox'

export interface BrewSave {
  teamId: string
  userId: string
  /** An existing brew to edit; a new one otherwise. */
  id?: string
  /** Every field for a new brew (with brewedAt); the form's fields for an edit. */
  data: BrewFields & { brewedAt?: string }
  /** Readings typed for it that are not stored yet (the brew's id is filled in here). */
  readings: NewReading[]
  /** Strength and yield as the phone computed them, shown until the server's own arrive. */
  derived: EntityDerived<'brew'>
  /** Why a teammate's brew is corrected: it goes with the edit and with each reading added to it. */
  reason?: string
}

/**
 * A brew and its new readings go to the phone's store and the outbox together, at once, offline
 * or not: all of it is saved or none.
 * @returns the brew's id
 */
export async function saveBrew(database: LixiviaDatabase, save: BrewSave): Promise<string> {
  const { teamId, userId, reason } = save
  // New readings get their ids first, so an outlier left out is set aside on the brew's record.
  const readings = save.readings.map(reading => ({ ...reading, id: uuidv7() }))
  const leftOut = readings.filter(reading => reading.leftOut).map(reading => reading.id)
  const data = leftOut.length ? { ...save.data, excludedReadingIds: [...save.data.excludedReadingIds, ...leftOut] } : save.data
  return database.transaction('rw', database.brews, database.readings, database.outbox, async () => {
    const brewId = await saveRecord(database, 'brew', { teamId, userId, id: save.id, data, reason })
    for (const reading of readings)
      await saveRecord(database, 'reading', { teamId, userId, id: reading.id, data: { ...reading.data, brewId }, reason })
    await database.brews.update(brewId, { derived: save.derived })
    return brewId
  })
}
