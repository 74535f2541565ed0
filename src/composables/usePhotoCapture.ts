import type { PhotoSave } from '../sync/photos'
import { ref } from 'vue'
import { db } from '../db/database'
import { fitWithin, photoLongSide, photoQuality } from '../forms/photoSize'
import { useSessionStore } from '../stores/session'
import { useSyncStore } from '../stores/sync'
import { savePhoto } from '../sync/photos'

/** Reads a picture and writes a smaller one: the browser's decoder and canvas, or a test's fake. */
export interface PictureCodec {
  decode: (file: Blob) => Promise<{ width: number, height: number, draw: (context: CanvasRenderingContext2D, width: number, height: number) => void, close: () => void }>
  encode: (size: { width: number, height: number }, draw: (context: CanvasRenderingContext2D) => void) => Promise<Blob>
}

/** A picture this phone cannot read or write, in words for the person. */
export class PhotoError extends Error {
  override name = 'PhotoError'
}

export const browserCodec: PictureCodec = {
  async decode(file) {
    // The camera's orientation flag is applied, so a portrait photo stays upright.
    const bitmap = await createImageBitmap(file, { imageOrientation: 'from-image' })
    return { width: bitmap.width, height: bitmap.height, draw: (context, width, height) => context.drawImage(bitmap, 0, 0, width, height), close: () => bitmap.close() }
  },
  encode(size, draw) {
    const canvas = document.createElement('canvas')
    canvas.width = size.width
    canvas.height = size.height
    const context = canvas.getContext('2d')
    if (!context)
      return Promise.reject(new PhotoError('This phone could not draw the photo.'))
    context.imageSmoothingQuality = 'high'
    draw(context)
    return new Promise((resolve, reject) => canvas.toBlob(blob => (blob ? resolve(blob) : reject(new PhotoError('This phone could not write the photo as a JPEG.'))), 'image/jpeg', photoQuality))
  },
}

/**
 * A photo shrunk to a long side of at most 1,600 px and written again as JPEG. Writing it again also
 * leaves out what the camera stored with it (the place it was taken among it).
 */
export async function shrinkPhoto(file: Blob, codec: PictureCodec = browserCodec): Promise<{ blob: Blob, width: number, height: number }> {
  let picture: Awaited<ReturnType<PictureCodec['decode']>>
  try {
    picture = await codec.decode(file)
  }
  catch {
    throw new PhotoError('This phone cannot read that file as a picture. Choose a JPEG, PNG or WebP photo.')
  }
  try {
    const size = fitWithin(picture.width, picture.height, photoLongSide)
    const blob = await codec.encode(size, context => picture.draw(context, size.width, size.height))
    return { blob, ...size }
  }
  finally {
    picture.close()
  }
}

/** Takes or picks a photo, shrinks it and keeps it on the phone with its record, ready to upload. */
export function usePhotoCapture() {
  const session = useSessionStore()
  const sync = useSyncStore()
  const state = ref<'idle' | 'saving' | 'done' | 'error'>('idle')
  const error = ref('')

  async function add(file: File, about: PhotoSave['about']): Promise<string | null> {
    if (!session.activeTeamId || !session.user)
      return null
    state.value = 'saving'
    error.value = ''
    try {
      const shrunk = await shrinkPhoto(file)
      const id = await savePhoto(db, { teamId: session.activeTeamId, userId: session.user.id, about, ...shrunk })
      state.value = 'done'
      void sync.syncNow()
      return id
    }
    catch (failure) {
      state.value = 'error'
      error.value = failure instanceof PhotoError ? failure.message : 'The photo could not be kept on this phone.'
      return null
    }
  }

  return { state, error, add }
}
