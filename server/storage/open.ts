import type { Env } from '../env'
import type { FileStorage } from './files'
import path from 'node:path'
import { s3SettingsOf } from '../env'
import { createDiskStorage } from './disk'
import { createS3Storage } from './s3'

export interface OpenedStorage {
  files: FileStorage
  /** Where files go, in words for the start log. */
  where: string
  /** Reaches the store once (the bucket with its keys); throws a ConfigError naming the setting. */
  check: () => Promise<void>
  close: () => void
}

/** The bucket the S3_ variables name, else the folder DATA_DIR/uploads. */
export function openFileStorage(env: Env): OpenedStorage {
  const s3 = s3SettingsOf(env)
  if (s3) {
    const bucket = createS3Storage(s3)
    return { files: bucket, where: `bucket "${s3.bucket}"${s3.endpoint ? ` at ${s3.endpoint}` : ''}`, check: bucket.check, close: bucket.close }
  }
  const folder = path.join(env.DATA_DIR, 'uploads')
  return { files: createDiskStorage(folder), where: folder, check: async () => {}, close: () => {} }
}
