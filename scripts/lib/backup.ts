import type { RowDataPacket } from 'mysql2/promise'
import type { DatabaseAccess } from './database-access'
import { spawnSync } from 'node:child_process'
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs'
import path from 'node:path'
import mysql from 'mysql2/promise'
import { z } from 'zod'
import pkg from '../../package.json' with { type: 'json' }
import { dumpDatabase, urlOf } from './database-access'
import { SetupError } from './system'

/** What a backup archive says of itself (manifest.json beside database.sql and uploads/). */
export const ManifestSchema = z.object({
  format: z.literal('lixivia-backup'),
  formatVersion: z.literal(1),
  createdAt: z.string(),
  appVersion: z.string(),
  records: z.number().int().nonnegative(),
  users: z.number().int().nonnegative(),
  uploadedFiles: z.number().int().nonnegative(),
  /** Set when photos live in a bucket, which the archive does not hold. */
  photosInBucket: z.string().nullable(),
})
export type Manifest = z.infer<typeof ManifestSchema>

const archivePattern = /^lixivia-backup-\d{8}-\d{6}Z\.tar\.gz$/

/** `lixivia-backup-20261203-020000Z.tar.gz`: names sort by date. */
export function archiveName(at: Date): string {
  const stamp = at.toISOString().replace(/\.\d{3}Z$/, 'Z').replace(/[-:]/g, '').replace('T', '-')
  return `lixivia-backup-${stamp}.tar.gz`
}

/** The archives to delete so that the newest `keep` stay. */
export function archivesBeyond(names: string[], keep: number): string[] {
  return names.filter(name => archivePattern.test(name)).sort().reverse().slice(keep)
}

function countFiles(dir: string): number {
  if (!existsSync(dir))
    return 0
  return readdirSync(dir, { recursive: true, withFileTypes: true }).filter(entry => entry.isFile() && !entry.name.endsWith('.json') && !entry.name.endsWith('.part')).length
}

function tar(args: string[]): void {
  const result = spawnSync('tar', args, { encoding: 'utf8' })
  if (result.status !== 0)
    throw new SetupError(`tar ${args[0]} failed: ${(result.stderr || result.stdout).trim()}`)
}

/** How many records and accounts a database holds (0 when it has no tables yet). */
export async function countsOf(access: DatabaseAccess): Promise<{ records: number, users: number, tables: number }> {
  const connection = await mysql.createConnection({ uri: urlOf(access) })
  try {
    const [tables] = await connection.query<RowDataPacket[]>('SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE()')
    const names = new Set(tables.map(row => String(row.name)))
    const count = async (table: string): Promise<number> => (names.has(table) ? Number((await connection.query<RowDataPacket[]>(`SELECT COUNT(*) AS n FROM ${table}`))[0][0]!.n) : 0)
    return { records: await count('records'), users: await count('users'), tables: names.size }
  }
  finally {
    await connection.end()
  }
}

/**
 * One dated archive under `backupsDir`: the database dumped in one transaction (the app may keep
 * running), the uploads folder, and a manifest; written under a temporary name and renamed, so a
 * half-written archive never looks like a backup. Then only the newest `keep` archives stay.
 */
export async function createBackup(options: { access: DatabaseAccess, uploadsDir: string, backupsDir: string, keep: number, photosInBucket: string | null, now?: Date }): Promise<{ file: string, manifest: Manifest, removed: string[] }> {
  mkdirSync(options.backupsDir, { recursive: true })
  const staging = mkdtempSync(path.join(options.backupsDir, '.staging-'))
  try {
    await dumpDatabase(options.access, path.join(staging, 'database.sql'))
    const counts = await countsOf(options.access)
    const manifest: Manifest = { format: 'lixivia-backup', formatVersion: 1, createdAt: (options.now ?? new Date()).toISOString(), appVersion: pkg.version, records: counts.records, users: counts.users, uploadedFiles: countFiles(options.uploadsDir), photosInBucket: options.photosInBucket }
    writeFileSync(path.join(staging, 'manifest.json'), `${JSON.stringify(manifest, null, 2)}\n`)
    const file = path.join(options.backupsDir, archiveName(options.now ?? new Date()))
    const partial = `${file}.partial`
    const uploads = existsSync(options.uploadsDir) ? ['-C', path.dirname(options.uploadsDir), path.basename(options.uploadsDir)] : []
    tar(['-czf', partial, '-C', staging, 'manifest.json', 'database.sql', ...uploads])
    renameSync(partial, file)
    const removed = archivesBeyond(readdirSync(options.backupsDir), options.keep)
    for (const name of removed)
      rmSync(path.join(options.backupsDir, name), { force: true })
    return { file, manifest, removed }
  }
  finally {
    rmSync(staging, { recursive: true, force: true })
  }
}

/** Unpacks an archive into a temporary folder and reads its manifest; the caller removes `dir`. */
export function openArchive(file: string, tempRoot: string): { dir: string, manifest: Manifest } {
  if (!existsSync(file) || !statSync(file).isFile())
    throw new SetupError(`There is no backup file at ${file}.`)
  const dir = mkdtempSync(path.join(tempRoot, 'lixivia-restore-'))
  tar(['-xzf', file, '-C', dir])
  const manifestFile = path.join(dir, 'manifest.json')
  const parsed = existsSync(manifestFile) ? ManifestSchema.safeParse(JSON.parse(readFileSync(manifestFile, 'utf8'))) : undefined
  if (!parsed?.success || !existsSync(path.join(dir, 'database.sql'))) {
    rmSync(dir, { recursive: true, force: true })
    throw new SetupError(`${file} is not a Lixivia backup (no manifest.json and database.sql in it).`)
  }
  return { dir, manifest: parsed.data }
}
