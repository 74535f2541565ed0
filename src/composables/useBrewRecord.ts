import type { Ref } from 'vue'
import type { LocalRecord, OutboxEntry } from '../db/database'
import { db } from '../db/database'
import { useLiveQuery } from './useLiveQuery'

export interface BrewRecordView {
  brew: LocalRecord<'brew'> | undefined
  /** Every reading of the brew, in the order taken (set-aside ones included). */
  readings: LocalRecord<'reading'>[]
  instrument: LocalRecord<'instrument'> | undefined
  /** The calibration the brew was measured through, which may no longer be the active one. */
  calibration: LocalRecord<'calibration'> | undefined
  /** Changes made on this phone that the server has not answered yet. */
  queued: OutboxEntry[]
}

const empty: BrewRecordView = { brew: undefined, readings: [], instrument: undefined, calibration: undefined, queued: [] }

/** One brew with everything that explains its result, live from the phone's store. */
export function useBrewRecord(id: Ref<string>) {
  return useLiveQuery<BrewRecordView>(async () => {
    const brew = await db.brews.get(id.value)
    if (!brew)
      return empty
    const readings = (await db.readings.where('brewId').equals(brew.id).toArray()).sort((a, b) => a.takenAt.localeCompare(b.takenAt) || a.id.localeCompare(b.id))
    const instrument = brew.instrumentId ? await db.instruments.get(brew.instrumentId) : undefined
    const calibration = brew.calibrationId ? await db.calibrations.get(brew.calibrationId) : undefined
    const queued = await db.outbox.where('id').equals(brew.id).toArray()
    return { brew, readings, instrument, calibration, queued }
  }, empty, id)
}
