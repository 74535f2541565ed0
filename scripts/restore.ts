// `npm run restore -- FILE [--replace]`: a backup archive back into DATA_DIR (or DATABASE_URL's database).
import { cpSync, existsSync, readdirSync, renameSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import mysql from 'mysql2/promise'
import { runMigrations } from '../server/db/migrate'
import { ConfigError } from '../server/env'
import { countsOf, openArchive } from './lib/backup'
import { loadDatabase, runningPrivateServer, urlOf, withStackDatabase } from './lib/database-access'
import { loadOrCreateSecrets } from './lib/secrets'
import { readStackEnv } from './lib/stack-env'
import { SetupError } from './lib/system'

const args = process.argv.slice(2)
const replace = args.includes('--replace')
const given = args.filter(arg => arg !== '--replace')

try {
  if (given.length !== 1)
    throw new SetupError('Name one backup file: npm run restore -- DATA_DIR/backups/lixivia-backup-….tar.gz [--replace]')
  // npm runs scripts in the repository; a relative path means where the person typed the command.
  const file = path.resolve(process.env.INIT_CWD ?? process.cwd(), given[0]!)
  const stackEnv = readStackEnv()
  const { dataDir } = stackEnv
  if (!stackEnv.DATABASE_URL && runningPrivateServer(dataDir))
    throw new SetupError(`Lixivia is running on ${dataDir}: stop it first (a restore replaces its data).`)
  const archive = openArchive(file, os.tmpdir())
  try {
    const uploadsDir = path.join(dataDir, 'uploads')
    const hasUploads = existsSync(uploadsDir) && readdirSync(uploadsDir).length > 0
    // A fresh DATA_DIR gets its private MariaDB initialised here, as `npm start` would.
    const secrets = loadOrCreateSecrets(dataDir)
    await withStackDatabase(stackEnv, secrets.dbPassword, async (access) => {
      const before = await countsOf(access)
      if ((before.tables > 0 || hasUploads) && !replace)
        throw new SetupError(`${stackEnv.DATABASE_URL ? `The database "${access.database}"` : dataDir} already holds data (${before.records} records, ${before.users} accounts): add --replace to put the backup in its place.`)
      if (before.tables > 0) {
        const connection = await mysql.createConnection({ uri: urlOf(access) })
        await connection.query(`DROP DATABASE ${mysql.escapeId(access.database)}`)
        await connection.query(`CREATE DATABASE ${mysql.escapeId(access.database)} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
        await connection.end()
      }
      await loadDatabase(access, path.join(archive.dir, 'database.sql'))
      // A backup of an older release is brought up to this one's schema, as a start would.
      await runMigrations(urlOf(access))
      const after = await countsOf(access)
      if (after.records < archive.manifest.records || after.users !== archive.manifest.users)
        throw new SetupError(`The restored database holds ${after.records} records and ${after.users} accounts; the backup said ${archive.manifest.records} and ${archive.manifest.users}.`)
    })
    if (hasUploads)
      renameSync(uploadsDir, `${uploadsDir}.before-restore-${Date.now()}`)
    if (existsSync(path.join(archive.dir, 'uploads')))
      cpSync(path.join(archive.dir, 'uploads'), uploadsDir, { recursive: true })
    const { manifest } = archive
    console.log(`Restored ${file} (made ${manifest.createdAt}) into ${stackEnv.DATABASE_URL ? 'the database DATABASE_URL names' : dataDir}:`)
    console.log(`  ${manifest.records} records, ${manifest.users} accounts, ${manifest.uploadedFiles} uploaded files${manifest.photosInBucket ? `; photos stay in ${manifest.photosInBucket}` : ''}`)
    console.log('Start Lixivia on it with the same DATA_DIR (npm start or npm run serve).')
  }
  finally {
    rmSync(archive.dir, { recursive: true, force: true })
  }
}
catch (error) {
  if (error instanceof SetupError || error instanceof ConfigError) {
    console.error(`Restore failed: ${error.message}`)
    process.exit(1)
  }
  throw error
}
