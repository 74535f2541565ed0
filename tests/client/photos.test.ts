// @vitest-environment node
// Node's own Blob survives fake-indexeddb's structured clone; happy-dom's does not (a browser keeps either).
import type { PictureCodec } from '../../src/composables/usePhotoCapture'
import type { UploadTransport } from '../../src/sync/uploads'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { PhotoError, shrinkPhoto } from '../../src/composables/usePhotoCapture'
import { LixiviaDatabase } from '../../src/db/database'
import { fitWithin } from '../../src/forms/photoSize'
import { localPhotoBlob, photoPath, savePhoto } from '../../src/sync/photos'
import { createUploader } from '../../src/sync/uploads'

/** A codec that reads "W×H" files and writes what it was asked to draw, so sizes can be checked. */
const fakeCodec: PictureCodec = {
  async decode(file) {
    const match = /^(\d+)×(\d+)$/.exec(await file.text())
    if (!match)
      throw new Error('not a picture')
    return { width: Number(match[1]), height: Number(match[2]), draw: () => {}, close: () => {} }
  },
  async encode(size, draw) {
    draw({} as CanvasRenderingContext2D)
    return new Blob([`jpeg ${size.width}×${size.height}`], { type: 'image/jpeg' })
  },
}
const picture = (width: number, height: number) => new Blob([`${width}×${height}`], { type: 'image/heic' })

describe('shrinkPhoto', () => {
  it.each([
    // A 12-megapixel phone camera's 4:3 frame, landscape and portrait.
    [4032, 3024, 1600, 1200],
    [3024, 4032, 1200, 1600],
    [1600, 900, 1600, 900],
    [640, 480, 640, 480],
    [5000, 1, 1600, 1],
  ])('draws %i × %i px at %i × %i px, as JPEG', async (width, height, w, h) => {
    const shrunk = await shrinkPhoto(picture(width, height), fakeCodec)
    expect({ width: shrunk.width, height: shrunk.height }).toEqual({ width: w, height: h })
    expect(await shrunk.blob.text()).toBe(`jpeg ${w}×${h}`)
    expect(shrunk.blob.type).toBe('image/jpeg')
  })

  it('says so when the phone cannot read the file as a picture', async () => {
    await expect(shrinkPhoto(new Blob(['%PDF-1.7']), fakeCodec)).rejects.toThrow(PhotoError)
  })

  it('never enlarges, and refuses a picture without pixels', () => {
    expect(fitWithin(800, 600)).toEqual({ width: 800, height: 600 })
    expect(() => fitWithin(0, 600)).toThrow(RangeError)
  })
})

let database: LixiviaDatabase
let n = 0
beforeEach(() => {
  database = new LixiviaDatabase(`photos-test-${n++}`)
})
afterEach(async () => {
  await database.delete()
})

const teamId = '0190a8c4-0000-7000-8000-0000000000aa'
const userId = '0190a8c4-0000-7000-8000-0000000000bb'
const lotId = '0190a8c4-0000-7000-8000-0000000000cc'

describe('a photo taken offline', () => {
  it('is kept with its record and queued at once, then uploads once when signal returns', async () => {
    const shrunk = await shrinkPhoto(picture(4032, 3024), fakeCodec)
    const id = await savePhoto(database, { teamId, userId, ...shrunk, about: { subject: 'lot', lotId, caption: 'Green, sample 3' } })

    const record = await database.photos.get(id)
    expect(record).toMatchObject({ subject: 'lot', lotId, contentType: 'image/jpeg', sizeBytes: shrunk.blob.size, width: 1600, height: 1200, sync: { state: 'pending' } })
    const queued = await database.outbox.where('id').equals(id).toArray()
    expect(queued).toMatchObject([{ entity: 'photo', op: 'put' }])
    expect(await database.uploads.get(id)).toMatchObject({ state: 'queued', path: photoPath(teamId, id), field: 'photo' })
    expect(await (await localPhotoBlob(database, id))!.text()).toBe('jpeg 1600×1200')

    // No signal: the file waits. Signal: it goes once, with the shrunk bytes.
    const sent: string[] = []
    let online = false
    const transport: UploadTransport = {
      async put(entry, onProgress) {
        if (!online)
          throw Object.assign(new Error('No network'), { status: 0 })
        onProgress(1)
        sent.push(`${entry.path} ${await entry.blob.text()}`)
      },
    }
    const uploader = createUploader({ database, transport, schedule: () => {} })
    await uploader.uploadNow()
    expect(await database.uploads.get(id)).toMatchObject({ state: 'queued', attempts: 1 })
    online = true
    await uploader.uploadNow()
    await uploader.uploadNow()
    expect(sent).toEqual([`${photoPath(teamId, id)} jpeg 1600×1200`])
    // The phone keeps its copy for the thumbnails.
    expect(await database.uploads.get(id)).toMatchObject({ state: 'sent' })
    expect(await localPhotoBlob(database, id)).not.toBeNull()
  })

  it('leaves nothing behind when its file cannot be queued', async () => {
    const shrunk = await shrinkPhoto(picture(800, 600), fakeCodec)
    // The file's queue fails after the record was written (a full disk): the one transaction undoes both.
    database.uploads.hook('creating', () => {
      throw new Error('QuotaExceededError')
    })
    await expect(savePhoto(database, { teamId, userId, ...shrunk, about: { subject: 'lot', lotId } })).rejects.toThrow('QuotaExceededError')
    expect(await database.photos.count()).toBe(0)
    expect(await database.outbox.count()).toBe(0)
    expect(await database.uploads.count()).toBe(0)
  })
})
