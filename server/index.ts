import type { Router } from 'express'
import type { Server } from 'node:http'
import type { Env } from './env'
import { once } from 'node:events'
import { existsSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'
import pkg from '../package.json' with { type: 'json' }
import { createApp } from './app'
import { createDatabase } from './db/client'
import { runMigrations } from './db/migrate'
import { ConfigError, mailSettingsOf, parseEnv, servesDevMail } from './env'
import { createLogger } from './logger'
import { Mailbox } from './mail/mailbox'
import { createMailer } from './mail/mailer'
import { openFileStorage } from './storage/open'

export interface RunningServer {
  url: string
  close: () => Promise<void>
}

export interface ServeOptions {
  /**
   * Reach the mail server (connect, TLS, sign-in) and the photo bucket before listening, so a
   * wrong setting stops the start with a message naming it instead of failing a person later.
   */
  checkServices?: boolean
  /** Extra pages (the phone set-up page) served before the client. */
  pages?: Router
}

export const distDir = fileURLToPath(new URL('../dist', import.meta.url))

/** Thrown when the HTTP port cannot be taken; the message says what to do. */
export class ListenError extends Error {
  override name = 'ListenError'
}

/**
 * env → database → app → listen (the caller has applied the migrations). Returns a handle whose `close` drains open requests
 * and releases the pool and the mail transport.
 */
export async function serve(env: Env, options: ServeOptions = {}): Promise<RunningServer> {
  const logger = createLogger(env.LOG_LEVEL)
  const mailer = createMailer(mailSettingsOf(env))
  const storage = openFileStorage(env)
  if (options.checkServices) {
    try {
      await Promise.all([mailer.verify(), storage.check()])
    }
    catch (error) {
      mailer.close()
      storage.close()
      throw error
    }
  }
  const database = createDatabase(env.DATABASE_URL)
  const app = createApp({
    database,
    mailer,
    logger,
    version: pkg.version,
    bodyLimit: env.BODY_LIMIT,
    jwtSecret: env.JWT_SECRET,
    publicUrl: env.PUBLIC_URL,
    devMailbox: servesDevMail(env) ? new Mailbox(path.join(env.DATA_DIR, 'mail')) : undefined,
    files: storage.files,
    staticDir: existsSync(distDir) ? distDir : undefined,
    trustProxy: env.TRUST_PROXY,
    secureCookies: env.SECURE_COOKIES,
    pages: options.pages,
  })

  const server: Server = app.listen(env.PORT, env.HOST)
  try {
    await once(server, 'listening')
  }
  catch (error) {
    await database.pool.end()
    mailer.close()
    storage.close()
    const code = (error as NodeJS.ErrnoException).code
    if (code === 'EADDRINUSE')
      throw new ListenError(`Port ${env.PORT} on ${env.HOST} is already in use (PORT). Stop the program using it or set PORT to a free port.`)
    throw error
  }
  const host = env.HOST.includes(':') ? `[${env.HOST}]` : env.HOST
  return {
    url: `http://${host}:${env.PORT}/`,
    async close() {
      server.closeIdleConnections()
      const closed = new Promise<void>(resolve => server.close(() => resolve()))
      // Requests still running after 10 s are cut so that a stop never hangs.
      const timer = setTimeout(() => server.closeAllConnections(), 10_000)
      await closed
      clearTimeout(timer)
      await database.pool.end()
      mailer.close()
      storage.close()
    },
  }
}

/** Run directly (`tsx server/index.ts`) against a database named by DATABASE_URL. */
async function main(): Promise<void> {
  let running: RunningServer
  try {
    const env = parseEnv()
    await runMigrations(env.DATABASE_URL)
    running = await serve(env, { checkServices: true })
  }
  catch (error) {
    if (error instanceof ConfigError || error instanceof ListenError) {
      console.error(error.message)
      process.exit(1)
    }
    throw error
  }
  console.log(`Lixivia API listening on ${running.url}`)
  const stop = (): void => {
    running.close().then(() => process.exit(0), () => process.exit(1))
  }
  process.once('SIGINT', stop)
  process.once('SIGTERM', stop)
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main().catch((error) => {
    console.error(error)
    process.exit(1)
  })
}
