import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { z } from 'zod'
import { ConfigError } from '../../server/env'
import { superviseMariaDb } from './supervise'

export const repoRoot = fileURLToPath(new URL('../..', import.meta.url))

const port = z.coerce.number().int().min(1).max(65535)
/** What every start, backup and restore command reads: where the data lives and which database. */
export const StackEnvSchema = z.object({
  PORT: port.default(8080),
  HOST: z.string().default('127.0.0.1'),
  DB_PORT: port.default(3307),
  SMTP_PORT: port.default(2526),
  DATA_DIR: z.string().min(1).default('.data'),
  DATABASE_URL: z.string().optional(),
})
export type StackEnv = z.infer<typeof StackEnvSchema>

export function readStackEnv(source: NodeJS.ProcessEnv = process.env): StackEnv & { dataDir: string } {
  const parsed = StackEnvSchema.safeParse(source)
  if (!parsed.success)
    throw new ConfigError(`Invalid configuration:\n${parsed.error.issues.map(i => `  ${i.path.join('.')}: ${i.message}`).join('\n')}`)
  // DATA_DIR is relative to the repository, as npm runs every script there.
  return { ...parsed.data, dataDir: path.resolve(repoRoot, parsed.data.DATA_DIR) }
}

export interface OpenedDatabase { url: string, stop: () => Promise<void> }

/**
 * The database the app uses: the one DATABASE_URL names, or the private MariaDB under
 * DATA_DIR/mariadb (initialised on first use), started and kept running.
 */
export async function openStackDatabase(stackEnv: StackEnv & { dataDir: string }, dbPassword: string, hooks: { log: (line: string) => void, onGiveUp: (reason: string) => void }): Promise<OpenedDatabase> {
  if (stackEnv.DATABASE_URL) {
    hooks.log('Using the database named by DATABASE_URL; no private MariaDB is started.')
    return { url: stackEnv.DATABASE_URL, stop: async () => {} }
  }
  hooks.log(`Starting the private MariaDB on 127.0.0.1:${stackEnv.DB_PORT} (data in ${path.join(stackEnv.dataDir, 'mariadb')}) ...`)
  const mariadb = await superviseMariaDb({ dataDir: path.join(stackEnv.dataDir, 'mariadb'), port: stackEnv.DB_PORT }, hooks)
  try {
    return { url: await mariadb.current().provisionUser('lixivia', dbPassword, 'lixivia'), stop: () => mariadb.stop() }
  }
  catch (error) {
    await mariadb.stop()
    throw error
  }
}
