import type { Env } from '../../server/env'
import type { RunningServer } from '../../server/index'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { z } from 'zod'
import { createDatabase } from '../../server/db/client'
import { runMigrations } from '../../server/db/migrate'
import { demoAccounts, demoPassword, demoTeamName, seedDemo } from '../../server/db/seed'
import { ConfigError, parseEnv, servesDevMail } from '../../server/env'
import { ListenError, serve } from '../../server/index'
import { startFakeSmtp } from '../../server/mail/fake-smtp'
import { createDiskStorage } from '../../server/storage/disk'
import { ensureClientBuilt } from './build'
import { loadOrCreateSecrets } from './secrets'
import { superviseMariaDb } from './supervise'
import { assertPortFree, SetupError } from './system'

export const repoRoot = fileURLToPath(new URL('../..', import.meta.url))

const port = z.coerce.number().int().min(1).max(65535)
const StackEnvSchema = z.object({
  PORT: port.default(8080),
  HOST: z.string().default('127.0.0.1'),
  DB_PORT: port.default(3307),
  SMTP_PORT: port.default(2526),
  DATA_DIR: z.string().min(1).default('.data'),
  DATABASE_URL: z.string().optional(),
})

type Stop = () => Promise<void>

/** Where the caught mail can be read: listed by the app on loopback in development, else only as files. */
export function mailNotice(env: Pick<Env, 'NODE_ENV' | 'HOST'>, smtp: { port: number, dir: string }, url: string): string {
  const kept = `Mail caught by the local SMTP fake (127.0.0.1:${smtp.port}) is kept in ${smtp.dir}, one .json and one .eml per message`
  if (servesDevMail(env))
    return `${kept}, and listed at ${url}api/v1/dev/mail.`
  const why = env.NODE_ENV === 'production' ? 'in production' : `while HOST (${env.HOST}) is not a loopback address`
  return `${kept}. The listing at /api/v1/dev/mail is off ${why}: read the files there.`
}

/**
 * Everything `npm start` (and the API half of `npm run dev`) needs: the client build, a private
 * MariaDB unless DATABASE_URL names another server, migrations, demo data on an empty database,
 * the fake SMTP server and the HTTP server. Ctrl-C or SIGTERM stops all of it in reverse order.
 */
export async function runStack(options: { build: boolean }): Promise<void> {
  const stops: Stop[] = []
  let stopping = false
  const shutdown = async (code: number): Promise<never> => {
    if (!stopping) {
      stopping = true
      for (const stop of stops.reverse())
        await stop().catch(error => console.error(`While stopping: ${(error as Error).message}`))
    }
    process.exit(code)
  }
  process.on('SIGINT', () => void shutdown(0))
  process.on('SIGTERM', () => void shutdown(0))

  try {
    const parsed = StackEnvSchema.safeParse(process.env)
    if (!parsed.success)
      throw new ConfigError(`Invalid configuration:\n${parsed.error.issues.map(i => `  ${i.path.join('.')}: ${i.message}`).join('\n')}`)
    const stackEnv = parsed.data
    const dataDir = path.resolve(repoRoot, stackEnv.DATA_DIR)
    const secrets = loadOrCreateSecrets(dataDir)

    if (options.build)
      ensureClientBuilt(repoRoot)
    await assertPortFree(stackEnv.PORT, 'PORT', stackEnv.HOST)
    await assertPortFree(stackEnv.SMTP_PORT, 'SMTP_PORT')

    let databaseUrl = stackEnv.DATABASE_URL
    if (!databaseUrl) {
      console.log(`Starting the private MariaDB on 127.0.0.1:${stackEnv.DB_PORT} (data in ${path.join(dataDir, 'mariadb')}) ...`)
      const mariadb = await superviseMariaDb({ dataDir: path.join(dataDir, 'mariadb'), port: stackEnv.DB_PORT }, {
        log: line => console.log(line),
        onGiveUp: (reason) => {
          console.error(`Lixivia stops: ${reason}`)
          void shutdown(1)
        },
      })
      stops.push(() => mariadb.stop())
      databaseUrl = await mariadb.current().provisionUser('lixivia', secrets.dbPassword, 'lixivia')
    }
    else {
      console.log('Using the database named by DATABASE_URL; no private MariaDB is started.')
    }

    const env = parseEnv({ JWT_SECRET: secrets.jwtSecret, ...process.env, DATABASE_URL: databaseUrl, DATA_DIR: dataDir, HOST: stackEnv.HOST, PORT: String(stackEnv.PORT), SMTP_PORT: String(stackEnv.SMTP_PORT) })
    await runMigrations(env.DATABASE_URL)
    const seeding = createDatabase(env.DATABASE_URL, { connectionLimit: 1 })
    const seeded = await seedDemo(seeding.db, createDiskStorage(path.join(dataDir, 'uploads'))).finally(() => seeding.pool.end())

    const smtp = await startFakeSmtp({ port: env.SMTP_PORT, mailDir: path.join(dataDir, 'mail') })
    stops.push(() => smtp.close())
    const server: RunningServer = await serve(env)
    stops.push(() => server.close())

    console.log(seeded ? `Demo data written: team "${demoTeamName}".` : 'Existing data kept (no demo data written).')
    console.log(`Demo sign-in (password "${demoPassword}" for each):`)
    for (const account of demoAccounts)
      console.log(`  ${account.role.padEnd(6)} ${account.name.padEnd(15)} ${account.email}`)
    console.log(mailNotice(env, { port: smtp.port, dir: smtp.mailbox.dir }, server.url))
    console.log(`Lixivia is ready at ${server.url}  (Ctrl-C stops it)`)
  }
  catch (error) {
    if (error instanceof SetupError || error instanceof ConfigError || error instanceof ListenError) {
      console.error(`Lixivia could not start: ${error.message}`)
      await shutdown(1)
    }
    console.error(error)
    await shutdown(1)
  }
}
