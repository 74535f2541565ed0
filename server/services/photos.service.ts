import type { PhotoUploadResponse } from '../../shared/schemas/origin'
import type { FileStorage, StoredFile } from '../storage/files'
import type { TeamsService } from './teams.service'
import { fileTypeFromBuffer } from 'file-type'
import { can } from '../../shared/records/rules'
import { PhotoTypeSchema } from '../../shared/schemas/origin'
import { HttpError, notFoundError } from '../http-error'
import { fileKey } from '../storage/files'
import { forbidden } from './teams.service'

/** Photos of a team: stored once by their phone-made id, read by the team's members only. */
export function createPhotosService(deps: { teams: TeamsService, files: FileStorage }) {
  const { teams, files } = deps

  return {
    /** Refuses before the bytes are read: 404 outside the team, 403 for a viewer. */
    async mayUpload(teamId: string, userId: string): Promise<void> {
      if (!can.uploadFiles(await teams.roleIn(teamId, userId)))
        throw forbidden('Viewers can look at the team\'s photos but not add any.')
    },

    /**
     * Stores a photo unless its id holds one already (a repeat after a lost answer stores nothing
     * twice). What the file is comes from its bytes, never from its name or the type it claims.
     */
    async put(teamId: string, photoId: string, bytes: Buffer): Promise<PhotoUploadResponse['photo']> {
      const found = await fileTypeFromBuffer(bytes)
      const type = PhotoTypeSchema.safeParse(found?.mime)
      if (!type.success)
        throw new HttpError(415, 'unsupported_media_type', `photo: the file is ${found ? `a ${found.mime} file` : 'not a picture this server recognises'}; send a JPEG, PNG or WebP photo.`)
      const key = fileKey(teamId, photoId)
      const stored = await files.put(key, bytes, type.data)
      if (stored.created)
        return { id: photoId, contentType: type.data, sizeBytes: stored.size, created: true }
      // Already there: the answer describes the file kept, not the copy that came again.
      const kept = await files.get(key)
      kept?.stream.destroy()
      return { id: photoId, contentType: PhotoTypeSchema.catch(type.data).parse(kept?.contentType), sizeBytes: stored.size, created: false }
    },

    /** A team member's read of a photo; 404 when the team or the photo is not there. */
    async get(teamId: string, photoId: string, userId: string): Promise<StoredFile> {
      await teams.roleIn(teamId, userId)
      const file = await files.get(fileKey(teamId, photoId))
      if (!file)
        throw notFoundError('photo')
      return file
    },
  }
}

export type PhotosService = ReturnType<typeof createPhotosService>
