import type { BucketStorage } from '../../server/storage/s3'
import type { FakeBucket } from './fake-bucket'
import type { TestDatabase } from './helpers'
import { text } from 'node:stream/consumers'
import request from 'supertest'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ConfigError, parseEnv } from '../../server/env'
import { openFileStorage } from '../../server/storage/open'
import { createS3Storage } from '../../server/storage/s3'
import { bearer, register } from './auth-helpers'
import { startFakeBucket } from './fake-bucket'
import { buildTestApp, createTestDatabase, testJwtSecret } from './helpers'
import { jpegBytes, pngBytes } from './image-bytes'

let bucket: FakeBucket
let files: BucketStorage
let database: TestDatabase
beforeAll(async () => {
  bucket = await startFakeBucket()
  files = createS3Storage(bucket.settings)
  database = await createTestDatabase()
})
afterAll(async () => {
  files?.close()
  await bucket?.close()
  await database?.drop()
})

const key = (): string => `${uuidv7()}/${uuidv7()}`

describe('the S3 file store', () => {
  it('stores a file once and reads back its bytes and type', async () => {
    const k = key()
    expect(await files.put(k, Buffer.from('green beans'), 'image/jpeg')).toEqual({ created: true, size: 11 })
    const stored = await files.get(k)
    expect(stored).toMatchObject({ size: 11, contentType: 'image/jpeg' })
    expect(await text(stored!.stream)).toBe('green beans')
  })

  it('keeps the first file when the same key comes again, and says so', async () => {
    const k = key()
    await files.put(k, Buffer.from('first'), 'image/png')
    expect(await files.put(k, Buffer.from('second, longer'), 'image/jpeg')).toEqual({ created: false, size: 5 })
    const stored = await files.get(k)
    expect(stored?.contentType).toBe('image/png')
    expect(await text(stored!.stream)).toBe('first')
  })

  it('answers null for a key it does not hold, and after a removal', async () => {
    const k = key()
    expect(await files.get(k)).toBeNull()
    await files.put(k, Buffer.from('x'), 'image/webp')
    await files.remove(k)
    expect(await files.get(k)).toBeNull()
  })

  it('refuses a key that is not team/file ids', async () => {
    await expect(files.put('../etc/passwd', Buffer.from('x'), 'image/png')).rejects.toThrow('Not a file key')
  })

  it('checks the bucket at start, naming the setting at fault', async () => {
    await expect(files.check()).resolves.toBeUndefined()
    const wrongKey = createS3Storage({ ...bucket.settings, accessKeyId: 'NOT-OUR-KEY' })
    await expect(wrongKey.check()).rejects.toThrow(/refused S3_ACCESS_KEY_ID "NOT-OUR-KEY": check S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY/)
    const noBucket = createS3Storage({ ...bucket.settings, bucket: 'no-such-bucket' })
    await expect(noBucket.check()).rejects.toThrow(/check S3_BUCKET/)
    await expect(noBucket.check()).rejects.toBeInstanceOf(ConfigError)
    wrongKey.close()
    noBucket.close()
  })

  it('is the store the S3_ variables choose; disk stays the default', () => {
    const base = { DATABASE_URL: 'mysql://u:p@127.0.0.1:3307/lixivia', JWT_SECRET: testJwtSecret, DATA_DIR: 'somewhere' }
    expect(openFileStorage(parseEnv(base)).where).toBe('somewhere/uploads')
    const { endpoint, bucket: name, accessKeyId, secretAccessKey } = bucket.settings
    const opened = openFileStorage(parseEnv({ ...base, S3_ENDPOINT: endpoint, S3_BUCKET: name, S3_ACCESS_KEY_ID: accessKeyId, S3_SECRET_ACCESS_KEY: secretAccessKey, S3_FORCE_PATH_STYLE: 'true' }))
    expect(opened.where).toBe(`bucket "lixivia-photos" at ${endpoint}`)
    opened.close()
  })
})

describe('photos in a bucket, end to end', () => {
  it('stores an upload, serves it to the team and stores a repeat of its id nothing twice', async () => {
    const app = buildTestApp(database, { files })
    const owner = await register(app, 'Owner')
    const teamId = (await request(app).post('/api/v1/teams').set(...bearer(owner)).send({ name: 'Harbour Green Buyers' })).body.team.id as string
    const id = uuidv7()
    const path = `/api/v1/teams/${teamId}/photos/${id}`
    const first = await request(app).put(path).set(...bearer(owner)).attach('photo', jpegBytes(), { filename: 'green.jpg', contentType: 'image/jpeg' })
    expect(first.status).toBe(201)
    const again = await request(app).put(path).set(...bearer(owner)).attach('photo', pngBytes(), { filename: 'other.png', contentType: 'image/png' })
    expect(again.status).toBe(200)
    expect(again.body.photo).toEqual({ id, contentType: 'image/jpeg', sizeBytes: jpegBytes().length, created: false })
    const read = await request(app).get(path).set(...bearer(owner)).buffer(true).parse((res, done) => {
      const chunks: Buffer[] = []
      res.on('data', (chunk: Buffer) => chunks.push(chunk))
      res.on('end', () => done(null, Buffer.concat(chunks)))
    })
    expect(read.status).toBe(200)
    expect(read.headers['content-type']).toBe('image/jpeg')
    expect(Buffer.compare(read.body as Buffer, jpegBytes())).toBe(0)
    expect((await request(app).get(`/api/v1/teams/${teamId}/photos/${uuidv7()}`).set(...bearer(owner))).status).toBe(404)
  })
})
