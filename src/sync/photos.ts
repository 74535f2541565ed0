import type { EntityDataInput } from '../../shared/schemas/entities'
import type { LixiviaDatabase } from '../db/database'
import { v7 as uuidv7 } from 'uuid'
import { saveRecord } from './outbox'
import { queueUpload } from './uploads'

/** The PUT path of a photo's bytes under /api/v1; the record and the file share the id. */
export const photoPath = (teamId: string, photoId: string): string => `/teams/${teamId}/photos/${photoId}`

export interface PhotoSave {
  teamId: string
  userId: string
  /** The shrunk picture (JPEG) and its size in pixels. */
  blob: Blob
  width: number
  height: number
  /** What it shows and what it belongs to. */
  about: Pick<EntityDataInput<'photo'>, 'subject' | 'tripId' | 'lotId' | 'brewId' | 'caption'>
}

/**
 * A photo's record and its bytes go to the phone in one transaction: the record into the outbox,
 * the bytes into the upload queue. Offline both wait; the record syncs first, then the file.
 * @returns the photo's id (a UUID v7 made here, the same for the record and the file)
 */
export async function savePhoto(database: LixiviaDatabase, save: PhotoSave): Promise<string> {
  const id = uuidv7()
  const contentType = 'image/jpeg'
  await database.transaction('rw', database.photos, database.outbox, database.uploads, async () => {
    await saveRecord(database, 'photo', {
      teamId: save.teamId,
      userId: save.userId,
      id,
      data: { ...save.about, contentType, sizeBytes: save.blob.size, width: save.width, height: save.height, takenAt: new Date().toISOString() },
    })
    await queueUpload(database, { id, teamId: save.teamId, path: photoPath(save.teamId, id), field: 'photo', blob: save.blob, fileName: `${id}.jpg` })
  })
  return id
}

/** The picture of a photo this phone holds: its own upload's blob, or a teammate's fetched before. */
export async function localPhotoBlob(database: LixiviaDatabase, photoId: string): Promise<Blob | null> {
  const [upload, fetched] = await Promise.all([database.uploads.get(photoId), database.photoFiles.get(photoId)])
  return upload?.blob ?? fetched?.blob ?? null
}
