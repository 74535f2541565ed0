import type { TestProject } from 'vitest/node'
import type { RunningMariaDb } from '../../scripts/lib/mariadb'
import { mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { startMariaDb } from '../../scripts/lib/mariadb'
import { freePort } from '../../scripts/lib/system'

declare module 'vitest' {
  export interface ProvidedContext {
    /** A MariaDB account that may create and drop databases (each test file makes its own). */
    adminUrl: string
  }
}

/**
 * One throwaway MariaDB for the whole server suite, on a free loopback port with a temp data
 * folder that is removed afterwards. DATABASE_URL in the environment points the suite at another
 * server instead (it must allow CREATE DATABASE).
 */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  if (process.env.TEST_DATABASE_URL) {
    project.provide('adminUrl', process.env.TEST_DATABASE_URL)
    return async () => {}
  }
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-test-db-'))
  let server: RunningMariaDb | undefined
  try {
    server = await startMariaDb({ dataDir, port: await freePort(), ephemeral: true })
    project.provide('adminUrl', await server.provisionUser('lixivia_test', 'test-only-password'))
  }
  catch (error) {
    rmSync(dataDir, { recursive: true, force: true })
    throw error
  }
  return async () => {
    await server?.stop()
    rmSync(dataDir, { recursive: true, force: true })
  }
}
