import type { TestProject } from 'vitest/node'
import type { StackProcess } from './stack'
import { mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { ensureDebianPackage, freePort } from '../../scripts/lib/system'
import { startStack } from './stack'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
    chromiumPath: string
  }
}

/** The product as `npm start` runs it, on free ports with a throwaway data folder. */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  // Debian's Chromium; a browser is never downloaded by a test tool.
  project.provide('chromiumPath', ensureDebianPackage('chromium', 'chromium', 'The browser tests'))
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-e2e-'))
  let stack: StackProcess
  try {
    stack = await startStack({ PORT: await freePort(), DB_PORT: await freePort(), SMTP_PORT: await freePort(), DATA_DIR: dataDir })
  }
  catch (error) {
    rmSync(dataDir, { recursive: true, force: true })
    throw error
  }
  project.provide('baseUrl', stack.url)
  return async () => {
    const code = await stack.stop()
    rmSync(dataDir, { recursive: true, force: true })
    if (code !== 0)
      throw new Error(`npm start exited with ${code} on SIGTERM:\n${stack.output()}`)
  }
}
