import type { S3Settings } from '../env'
import type { FileStorage } from './files'
import { Readable } from 'node:stream'
import { DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, HeadObjectCommand, PutObjectCommand, S3Client, S3ServiceException } from '@aws-sdk/client-s3'
import { ConfigError } from '../env'
import { fileKeyPattern } from './files'

const status = (error: unknown): number | undefined => (error instanceof S3ServiceException ? error.$metadata.httpStatusCode : undefined)
const missing = (error: unknown): boolean => status(error) === 404 || (error instanceof S3ServiceException && ['NotFound', 'NoSuchKey'].includes(error.name))

export interface BucketStorage extends FileStorage {
  /** Reaches the bucket once with the configured keys; throws a ConfigError naming the setting at fault. */
  check: () => Promise<void>
  close: () => void
}

/**
 * Files in an S3-compatible bucket, one object per key (`teamId/fileId`) with its content type.
 * Write-once like the disk store: a key that holds an object keeps it. The put asks first, then
 * writes with `If-None-Match: *`, so a bucket that supports conditional writes also refuses the
 * second of two uploads of one id arriving at the same moment (412, answered as "already there").
 */
export function createS3Storage(settings: S3Settings): BucketStorage {
  const client = new S3Client({
    endpoint: settings.endpoint,
    region: settings.region,
    forcePathStyle: settings.forcePathStyle,
    credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
    // Photos are small and the phone retries: one quick retry here, not the SDK's three.
    maxAttempts: 2,
  })
  const Bucket = settings.bucket
  const checked = (key: string): string => {
    if (!fileKeyPattern.test(key))
      throw new Error(`Not a file key: ${key}`)
    return key
  }
  const sizeOf = async (Key: string): Promise<number | null> => {
    try {
      return (await client.send(new HeadObjectCommand({ Bucket, Key }))).ContentLength ?? 0
    }
    catch (error) {
      if (missing(error))
        return null
      throw error
    }
  }

  return {
    async put(key, bytes, contentType) {
      const Key = checked(key)
      const existing = await sizeOf(Key)
      if (existing !== null)
        return { created: false, size: existing }
      try {
        await client.send(new PutObjectCommand({ Bucket, Key, Body: bytes, ContentType: contentType, ContentLength: bytes.length, IfNoneMatch: '*' }))
        return { created: true, size: bytes.length }
      }
      catch (error) {
        if (status(error) !== 412)
          throw error
        return { created: false, size: (await sizeOf(Key)) ?? bytes.length }
      }
    },

    async get(key) {
      try {
        const object = await client.send(new GetObjectCommand({ Bucket, Key: checked(key) }))
        if (!(object.Body instanceof Readable))
          throw new Error(`The bucket answered ${key} without a readable body.`)
        return { stream: object.Body, size: object.ContentLength ?? 0, contentType: object.ContentType ?? 'application/octet-stream' }
      }
      catch (error) {
        if (missing(error))
          return null
        throw error
      }
    },

    async remove(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: checked(key) }))
    },

    async check() {
      try {
        await client.send(new HeadBucketCommand({ Bucket }))
      }
      catch (error) {
        const code = status(error)
        const where = `bucket "${Bucket}"${settings.endpoint ? ` at ${settings.endpoint}` : ''}`
        if (code === 404)
          throw new ConfigError(`Photos: there is no ${where}: check S3_BUCKET (and S3_ENDPOINT), or create the bucket first.`)
        if (code === 403 || code === 401)
          throw new ConfigError(`Photos: the ${where} refused S3_ACCESS_KEY_ID "${settings.accessKeyId}": check S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY and the key's rights on the bucket.`)
        if (code === 301 || code === 400)
          throw new ConfigError(`Photos: the ${where} answered ${code}: check S3_REGION ("${settings.region}") and S3_FORCE_PATH_STYLE.`)
        throw new ConfigError(`Photos: the ${where} could not be reached: check S3_ENDPOINT (${(error as Error).message}).`)
      }
    },

    close: () => client.destroy(),
  }
}
