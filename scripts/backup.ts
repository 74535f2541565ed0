// `npm run backup`: the database and the uploads folder in one dated archive under DATA_DIR/backups.
import path from 'node:path'
import { z } from 'zod'
import { ConfigError } from '../server/env'
import { createBackup } from './lib/backup'
import { withStackDatabase } from './lib/database-access'
import { loadOrCreateSecrets } from './lib/secrets'
import { readStackEnv } from './lib/stack-env'
import { SetupError } from './lib/system'

const KeepSchema = z.coerce.number().int().min(1, 'must keep at least one backup').max(10_000).default(7)

try {
  const stackEnv = readStackEnv()
  const keep = KeepSchema.safeParse(process.env.BACKUP_KEEP)
  if (!keep.success)
    throw new ConfigError(`BACKUP_KEEP: ${keep.error.issues[0]!.message}`)
  const secrets = loadOrCreateSecrets(stackEnv.dataDir)
  const bucket = process.env.S3_BUCKET ? `bucket "${process.env.S3_BUCKET}"` : null
  const result = await withStackDatabase(stackEnv, secrets.dbPassword, access => createBackup({
    access,
    uploadsDir: path.join(stackEnv.dataDir, 'uploads'),
    backupsDir: path.join(stackEnv.dataDir, 'backups'),
    keep: keep.data,
    photosInBucket: bucket,
  }))
  const { manifest } = result
  console.log(`Backup written: ${result.file}`)
  console.log(`  ${manifest.records} records, ${manifest.users} accounts, ${manifest.uploadedFiles} uploaded files${bucket ? ` (photos live in ${bucket}, which this archive does not hold)` : ''}`)
  if (result.removed.length)
    console.log(`  Older backups removed (keeping ${keep.data}): ${result.removed.join(', ')}`)
}
catch (error) {
  if (error instanceof SetupError || error instanceof ConfigError) {
    console.error(`Backup failed: ${error.message}`)
    process.exit(1)
  }
  throw error
}
