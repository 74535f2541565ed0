import type { Env } from '../../server/env'
import type { RunningServer } from '../../server/index'
import path from 'node:path'
import { createDatabase } from '../../server/db/client'
import { runMigrations } from '../../server/db/migrate'
import { demoAccounts, demoPassword, demoTeamName, seedDemo } from '../../server/db/seed'
import { ConfigError, parseEnv, servesDevMail } from '../../server/env'
import { ListenError, serve } from '../../server/index'
import { startFakeSmtp } from '../../server/mail/fake-smtp'
import { openFileStorage } from '../../server/storage/open'
import { ensureClientBuilt } from './build'
import { lifecycle } from './lifecycle'
import { loadOrCreateSecrets } from './secrets'
import { openStackDatabase, readStackEnv, repoRoot } from './stack-env'
import { assertPortFree, SetupError } from './system'

export { repoRoot }

/** Where the caught mail can be read: listed by the app on loopback in development, else only as files. */
export function mailNotice(env: Pick<Env, 'NODE_ENV' | 'HOST'>, smtp: { port: number, dir: string }, url: string): string {
  const kept = `Mail caught by the local SMTP fake (127.0.0.1:${smtp.port}) is kept in ${smtp.dir}, one .json and one .eml per message`
  if (servesDevMail(env))
    return `${kept}, and listed at ${url}api/v1/dev/mail.`
  const why = env.NODE_ENV === 'production' ? 'in production' : `while HOST (${env.HOST}) is not a loopback address`
  return `${kept}. The listing at /api/v1/dev/mail is off ${why}: read the files there.`
}

/** Migrations, then the demo team into an empty database; says whether it wrote the demo. */
export async function prepareDatabase(env: Env, options: { demo: boolean }): Promise<boolean> {
  await runMigrations(env.DATABASE_URL)
  if (!options.demo)
    return false
  const seeding = createDatabase(env.DATABASE_URL, { connectionLimit: 1 })
  const storage = openFileStorage(env)
  try {
    return await seedDemo(seeding.db, storage.files)
  }
  finally {
    storage.close()
    await seeding.pool.end()
  }
}

/** A setup problem ends the start with its one-line message; anything else with its stack. */
export function startFailure(error: unknown): string {
  if (error instanceof SetupError || error instanceof ConfigError || error instanceof ListenError)
    return `Lixivia could not start: ${error.message}`
  return String((error as Error).stack ?? error)
}

/**
 * Everything `npm start` (and the API half of `npm run dev`) needs: the client build, a private
 * MariaDB unless DATABASE_URL names another server, migrations, demo data on an empty database,
 * the fake SMTP server and the HTTP server. Ctrl-C or SIGTERM stops all of it in reverse order.
 */
export async function runStack(options: { build: boolean }): Promise<void> {
  const { onStop, shutdown } = lifecycle()
  try {
    const stackEnv = readStackEnv()
    const { dataDir } = stackEnv
    const secrets = loadOrCreateSecrets(dataDir)

    if (options.build)
      ensureClientBuilt(repoRoot)
    await assertPortFree(stackEnv.PORT, 'PORT', stackEnv.HOST)
    // Mail goes to the local catcher unless SMTP_HOST names a server of one's own.
    const catcher = !process.env.SMTP_HOST
    if (catcher)
      await assertPortFree(stackEnv.SMTP_PORT, 'SMTP_PORT')

    const database = await openStackDatabase(stackEnv, secrets.dbPassword, {
      log: line => console.log(line),
      onGiveUp: (reason) => {
        console.error(`Lixivia stops: ${reason}`)
        void shutdown(1)
      },
    })
    onStop(database.stop)

    const env = parseEnv({ JWT_SECRET: secrets.jwtSecret, ...process.env, DATABASE_URL: database.url, DATA_DIR: dataDir, HOST: stackEnv.HOST, PORT: String(stackEnv.PORT), ...(catcher ? { SMTP_PORT: String(stackEnv.SMTP_PORT) } : {}) })
    const seeded = await prepareDatabase(env, { demo: true })

    const smtp = catcher ? await startFakeSmtp({ port: env.SMTP_PORT, mailDir: path.join(dataDir, 'mail') }) : undefined
    if (smtp)
      onStop(() => smtp.close())
    const server: RunningServer = await serve(env, { checkServices: true })
    onStop(() => server.close())

    console.log(seeded ? `Demo data written: team "${demoTeamName}".` : 'Existing data kept (no demo data written).')
    console.log(`Demo sign-in (password "${demoPassword}" for each):`)
    for (const account of demoAccounts)
      console.log(`  ${account.role.padEnd(6)} ${account.name.padEnd(15)} ${account.email}`)
    console.log(smtp ? mailNotice(env, { port: smtp.port, dir: smtp.mailbox.dir }, server.url) : `Mail goes to ${env.SMTP_HOST}:${env.SMTP_PORT}.`)
    console.log(`Lixivia is ready at ${server.url}  (Ctrl-C stops it)`)
  }
  catch (error) {
    console.error(startFailure(error))
    await shutdown(1)
  }
}
