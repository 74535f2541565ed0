import type { RequestHandler } from 'express'
import type { PhotosService } from '../services/photos.service'
import { Router } from 'express'
import multer from 'multer'
import { z } from 'zod'
import { maxPhotoBytes } from '../../shared/schemas/origin'
import { IdSchema } from '../../shared/schemas/primitives'
import { HttpError } from '../http-error'
import { currentUserId } from '../middleware/auth'

const PhotoParams = z.object({ teamId: IdSchema, photoId: IdSchema })

/** One file in the `photo` field, held in memory up to 8 MiB and refused past it. */
function readPhoto(): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxPhotoBytes, files: 1, fields: 10 } }).single('photo')
  return (req, res, next) => {
    upload(req, res, (error: unknown) => {
      if (!error)
        return next()
      // What the phone still sends after a refusal is read and dropped, so the answer reaches it.
      req.resume()
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE')
          return next(new HttpError(413, 'payload_too_large', 'photo: the file is larger than 8 MB; the app shrinks photos before sending them.'))
        return next(new HttpError(400, 'invalid_input', `photo: send one picture in the multipart field "photo" (${error.message.toLowerCase()}).`))
      }
      next(error)
    })
  }
}

/** `PUT` and `GET /teams/:teamId/photos/:photoId`; behind requireAuth. */
export function photoRoutes(photos: PhotosService): Router {
  const router = Router()
  const path = '/teams/:teamId/photos/:photoId'

  router.put(path, async (req, _res, next) => {
    const { teamId } = PhotoParams.parse(req.params)
    await photos.mayUpload(teamId, currentUserId(req))
    next()
  }, readPhoto(), async (req, res) => {
    const { teamId, photoId } = PhotoParams.parse(req.params)
    if (!req.file)
      throw new HttpError(400, 'invalid_input', 'photo: attach the picture in the multipart field "photo".')
    const photo = await photos.put(teamId, photoId, req.file.buffer)
    res.status(photo.created ? 201 : 200).json({ photo })
  })

  router.get(path, async (req, res) => {
    const { teamId, photoId } = PhotoParams.parse(req.params)
    const file = await photos.get(teamId, photoId, currentUserId(req))
    res.setHeader('Content-Type', file.contentType)
    res.setHeader('Content-Length', String(file.size))
    // A photo's id never names other bytes: the phone may keep it for good, but only for this person.
    res.setHeader('Cache-Control', 'private, max-age=31536000, immutable')
    file.stream.once('error', error => res.destroy(error))
    file.stream.pipe(res)
  })
  return router
}
