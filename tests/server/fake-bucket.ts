import type { S3Settings } from '../../server/env'
import { mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import S3rver from 's3rver'
import { freePort } from '../../scripts/lib/system'

export interface FakeBucket {
  settings: S3Settings
  close: () => Promise<void>
}

/**
 * s3rver on loopback with one bucket: an S3-compatible server that knows one access key id
 * (S3RVER; it does not check V4 signatures), its files in a temp folder removed on close.
 */
export async function startFakeBucket(bucket = 'lixivia-photos'): Promise<FakeBucket> {
  const directory = mkdtempSync(path.join(os.tmpdir(), 'lixivia-s3-'))
  const port = await freePort()
  const server = new S3rver({ address: '127.0.0.1', port, silent: true, directory, configureBuckets: [{ name: bucket }] })
  await server.run()
  return {
    settings: { endpoint: `http://127.0.0.1:${port}`, bucket, region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', forcePathStyle: true },
    async close() {
      await server.close()
      rmSync(directory, { recursive: true, force: true })
    },
  }
}
