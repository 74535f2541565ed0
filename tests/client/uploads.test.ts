// @vitest-environment node
// Node's own Blob survives fake-indexeddb's structured clone; happy-dom's does not (a browser keeps either).
import type { UploadEntry } from '../../src/db/database'
import type { UploadStatus, UploadTransport } from '../../src/sync/uploads'
import { v7 as uuidv7 } from 'uuid'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { LixiviaDatabase } from '../../src/db/database'
import { createUploader, queueUpload, retryUpload } from '../../src/sync/uploads'

class Failure extends Error {
  constructor(readonly status: number, message: string) {
    super(message)
  }
}

/** A server that keeps files by id, stores each once, and can be told how to answer next. */
function fakeFileServer() {
  const stored = new Map<string, string>()
  const answers: (number | 'ok')[] = []
  let puts = 0
  const transport: UploadTransport = {
    async put(entry, onProgress) {
      puts += 1
      const answer = answers.shift() ?? 'ok'
      if (answer !== 'ok')
        throw new Failure(answer, answer === 0 ? 'No network' : `Refused with ${answer}`)
      onProgress(0.5)
      if (!stored.has(entry.id))
        stored.set(entry.id, await entry.blob.text())
      onProgress(1)
    },
  }
  return { transport, stored, answers, puts: () => puts }
}

let database: LixiviaDatabase
let n = 0
beforeEach(() => {
  database = new LixiviaDatabase(`uploads-test-${n++}`)
})
afterEach(async () => {
  await database.delete()
})

const teamId = '0190a8c4-0000-7000-8000-0000000000aa'
async function queue(text: string): Promise<string> {
  const id = uuidv7()
  await queueUpload(database, { id, teamId, path: `/teams/${teamId}/photos/${id}`, field: 'photo', blob: new Blob([text], { type: 'image/jpeg' }), fileName: `${id}.jpg` })
  return id
}
const states = async (): Promise<UploadEntry['state'][]> => (await database.uploads.orderBy('createdAt').toArray()).map(entry => entry.state)

describe('the upload queue', () => {
  it('keeps a file offline, then sends it once when signal returns, showing progress', async () => {
    const server = fakeFileServer()
    const seen: UploadStatus[] = []
    const retries: number[] = []
    const uploader = createUploader({ database, transport: server.transport, onStatus: s => seen.push(s), schedule: (_retry, delay) => retries.push(delay) })
    const id = await queue('green beans, lot 4')
    server.answers.push(0)
    await uploader.uploadNow()
    expect(await states()).toEqual(['queued'])
    expect(retries).toEqual([2000])
    await uploader.uploadNow()
    expect(await states()).toEqual(['sent'])
    expect(server.stored.get(id)).toBe('green beans, lot 4')
    expect(seen.some(s => s.sending?.id === id && s.sending.progress === 0.5)).toBe(true)
    expect(seen.at(-1)).toEqual({ waiting: 0, sending: null, failed: 0 })
    // Sent files are not sent again, and queueing the same id again changes nothing.
    await queue('another')
    await queueUpload(database, { id, teamId, path: `/teams/${teamId}/photos/${id}`, field: 'photo', blob: new Blob(['changed']), fileName: 'x.jpg' })
    await uploader.uploadNow()
    expect(server.puts()).toBe(3)
    expect(server.stored.get(id)).toBe('green beans, lot 4')
  })

  it('backs off after each passing failure, and starts again from 2 s once one goes through', async () => {
    const server = fakeFileServer()
    const retries: number[] = []
    const uploader = createUploader({ database, transport: server.transport, schedule: (_retry, delay) => retries.push(delay) })
    await queue('a')
    server.answers.push(503, 0, 429)
    for (let i = 0; i < 4; i++)
      await uploader.uploadNow()
    expect(retries).toEqual([2000, 4000, 8000])
    expect(await states()).toEqual(['sent'])
  })

  it('marks a refused file failed with the reason, and sends it again only when asked', async () => {
    const server = fakeFileServer()
    const uploader = createUploader({ database, transport: server.transport, schedule: () => {} })
    const id = await queue('not really a picture')
    server.answers.push(415)
    await uploader.uploadNow()
    expect(await database.uploads.get(id)).toMatchObject({ state: 'failed', error: 'Refused with 415', attempts: 1 })
    await uploader.uploadNow()
    expect(server.puts()).toBe(1)
    await retryUpload(database, id)
    await uploader.uploadNow()
    expect(await database.uploads.get(id)).toMatchObject({ state: 'sent', attempts: 2 })
  })

  it('sends again a file cut off mid-way when the app closed', async () => {
    const server = fakeFileServer()
    const id = await queue('half sent')
    await database.uploads.update(id, { state: 'sending', progress: 0.4 })
    await createUploader({ database, transport: server.transport }).uploadNow()
    expect(await states()).toEqual(['sent'])
  })
})
