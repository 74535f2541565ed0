import type { ChildProcess } from 'node:child_process'
import { spawn } from 'node:child_process'
import https from 'node:https'
import { fileURLToPath } from 'node:url'

const repoRoot = fileURLToPath(new URL('../..', import.meta.url))

export interface ServeProcess {
  child: ChildProcess
  stdout: () => string
  stderr: () => string
  /** The fields of the "Lixivia is ready" log line. */
  ready: { url: string, phonePage: string, rootFingerprint?: string }
  /** SIGTERM, then the exit code once Caddy, the app and MariaDB have stopped. */
  stop: () => Promise<number | null>
}

/** Each stdout line as the JSON it must be; throws on the first that is not. */
export function jsonLines(stdout: string): Record<string, unknown>[] {
  return stdout.split('\n').filter(Boolean).map((line) => {
    try {
      return JSON.parse(line) as Record<string, unknown>
    }
    catch {
      throw new Error(`Not a JSON line on stdout: ${line}`)
    }
  })
}

/** Runs exactly what `npm run serve` runs, with these variables, until it logs that it is ready. */
export async function startServe(settings: Record<string, string | number>, timeoutMs = 200_000): Promise<ServeProcess> {
  const env: NodeJS.ProcessEnv = { ...process.env, LOG_LEVEL: 'info', ...Object.fromEntries(Object.entries(settings).map(([key, value]) => [key, String(value)])) }
  delete env.NODE_ENV
  if (!('DATABASE_URL' in settings))
    delete env.DATABASE_URL
  const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/serve.ts'], { cwd: repoRoot, env, stdio: ['ignore', 'pipe', 'pipe'] })
  let stdout = ''
  let stderr = ''
  child.stdout?.on('data', (chunk: Buffer) => (stdout += chunk.toString()))
  child.stderr?.on('data', (chunk: Buffer) => (stderr += chunk.toString()))
  const exited = new Promise<number | null>(resolve => child.once('exit', code => resolve(code)))
  const ready = await new Promise<ServeProcess['ready']>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`npm run serve did not get ready in ${timeoutMs} ms:\n${stdout}\n${stderr}`)), timeoutMs)
    const check = (): void => {
      const line = stdout.split('\n').find(text => text.includes('"msg":"Lixivia is ready"'))
      if (line) {
        clearTimeout(timer)
        resolve(JSON.parse(line) as ServeProcess['ready'])
      }
    }
    child.stdout?.on('data', check)
    void exited.then((code) => {
      clearTimeout(timer)
      reject(new Error(`npm run serve exited with ${code} before it was ready:\n${stdout}\n${stderr}`))
    })
  })
  return {
    child,
    stdout: () => stdout,
    stderr: () => stderr,
    ready,
    async stop() {
      child.kill('SIGTERM')
      return exited
    },
  }
}

/** A JSON request over HTTPS to loopback for a named site, trusting only the given root certificate. */
export function httpsJson<T = unknown>(options: { port: number, host: string, ca: string, path: string, method?: string, body?: unknown, token?: string, headers?: Record<string, string> }): Promise<{ status: number, body: T }> {
  const payload = options.body === undefined ? undefined : JSON.stringify(options.body)
  return new Promise((resolve, reject) => {
    const request = https.request({
      host: '127.0.0.1',
      port: options.port,
      servername: options.host,
      ca: options.ca,
      method: options.method ?? 'GET',
      path: options.path,
      headers: { 'Host': `${options.host}:${options.port}`, 'Content-Type': 'application/json', ...(options.token ? { Authorization: `Bearer ${options.token}` } : {}), ...options.headers },
    }, (response) => {
      let text = ''
      response.on('data', (chunk: Buffer) => (text += chunk.toString()))
      response.on('end', () => resolve({ status: response.statusCode ?? 0, body: (text ? JSON.parse(text) : null) as T }))
    })
    request.once('error', reject)
    request.end(payload)
  })
}
