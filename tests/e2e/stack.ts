import type { ChildProcess } from 'node:child_process'
import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'

const repoRoot = fileURLToPath(new URL('../..', import.meta.url))

export interface StackSettings {
  PORT: number
  DB_PORT: number
  SMTP_PORT: number
  DATA_DIR: string
}

export interface StackProcess {
  url: string
  child: ChildProcess
  output: () => string
  /** SIGTERM, then the exit code once everything it started has stopped. */
  stop: () => Promise<number | null>
}

/** Runs exactly what `npm start` runs, on the given ports and data folder. */
export function runStart(settings: StackSettings): { child: ChildProcess, output: () => string, exited: Promise<number | null> } {
  const env: NodeJS.ProcessEnv = { ...process.env, NODE_ENV: 'development', LOG_LEVEL: 'warn', ...Object.fromEntries(Object.entries(settings).map(([key, value]) => [key, String(value)])) }
  // The product under test always runs its own private MariaDB.
  delete env.DATABASE_URL
  const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/start.ts'], { cwd: repoRoot, env, stdio: ['ignore', 'pipe', 'pipe'] })
  let output = ''
  child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()))
  child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()))
  const exited = new Promise<number | null>(resolve => child.once('exit', code => resolve(code)))
  return { child, output: () => output, exited }
}

/** Starts the stack and resolves with its URL once it says it is ready. */
export async function startStack(settings: StackSettings, timeoutMs = 200_000): Promise<StackProcess> {
  const run = runStart(settings)
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`npm start did not get ready in ${timeoutMs} ms:\n${run.output()}`)), timeoutMs)
    const check = (): void => {
      const match = /Lixivia is ready at (\S+)/.exec(run.output())
      if (match) {
        clearTimeout(timer)
        resolve(match[1]!)
      }
    }
    run.child.stdout?.on('data', check)
    void run.exited.then((code) => {
      clearTimeout(timer)
      reject(new Error(`npm start exited with ${code} before it was ready:\n${run.output()}`))
    })
  })
  return {
    url,
    child: run.child,
    output: run.output,
    async stop() {
      run.child.kill('SIGTERM')
      return run.exited
    },
  }
}
