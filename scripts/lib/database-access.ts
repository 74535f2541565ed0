import type { StackEnv } from './stack-env'
import { spawn } from 'node:child_process'
import { createReadStream, createWriteStream, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { pipeline } from 'node:stream/promises'
import { startMariaDb } from './mariadb'
import { ensureDebianPackage, processAlive, SetupError } from './system'

/** A database to dump into or load from, as the mariadb client programs take it. */
export interface DatabaseAccess { host: string, port: number, user: string, password: string, database: string }

export function accessOf(url: string): DatabaseAccess {
  const parsed = new URL(url)
  return { host: parsed.hostname, port: Number(parsed.port || 3306), user: decodeURIComponent(parsed.username), password: decodeURIComponent(parsed.password), database: parsed.pathname.slice(1) || 'lixivia' }
}

export const urlOf = (a: DatabaseAccess): string => `mysql://${encodeURIComponent(a.user)}:${encodeURIComponent(a.password)}@${a.host}:${a.port}/${a.database}`

/** The private MariaDB of a data folder, when a running Lixivia started it: its pid and port. */
export function runningPrivateServer(dataDir: string): { pid: number, port: number } | undefined {
  const pidFile = path.join(dataDir, 'mariadb', 'mariadbd.pid')
  if (!existsSync(pidFile))
    return undefined
  const pid = Number.parseInt(readFileSync(pidFile, 'utf8'), 10)
  if (!Number.isInteger(pid) || !processAlive(pid))
    return undefined
  try {
    const args = readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0')
    const port = args.find(arg => arg.startsWith('--port='))
    if (!args.includes(`--datadir=${path.join(dataDir, 'mariadb')}`) || !port)
      return undefined
    return { pid, port: Number(port.slice('--port='.length)) }
  }
  catch {
    return undefined
  }
}

/**
 * Runs `work` on the database `npm start` would use: DATABASE_URL's, else the private MariaDB of
 * DATA_DIR, the running one when Lixivia runs, else one started for the while (initialising an
 * empty data folder first) and stopped afterwards.
 */
export async function withStackDatabase<T>(stackEnv: StackEnv & { dataDir: string }, dbPassword: string, work: (access: DatabaseAccess, running: boolean) => Promise<T>): Promise<T> {
  if (stackEnv.DATABASE_URL)
    return work(accessOf(stackEnv.DATABASE_URL), false)
  const running = runningPrivateServer(stackEnv.dataDir)
  if (running)
    return work({ host: '127.0.0.1', port: running.port, user: 'lixivia', password: dbPassword, database: 'lixivia' }, true)
  const server = await startMariaDb({ dataDir: path.join(stackEnv.dataDir, 'mariadb'), port: stackEnv.DB_PORT })
  try {
    return await work(accessOf(await server.provisionUser('lixivia', dbPassword, 'lixivia')), false)
  }
  finally {
    await server.stop()
  }
}

/** Runs a MariaDB client program with the password in a private options file, never on the command line. */
async function runClient(program: string, access: DatabaseAccess, args: string[], io: { input?: string, output?: string }): Promise<void> {
  const binary = ensureDebianPackage(program, 'mariadb-client', 'Backups')
  const folder = mkdtempSync(path.join(os.tmpdir(), 'lixivia-db-client-'))
  const options = path.join(folder, 'client.cnf')
  writeFileSync(options, `[client]\nhost=${access.host}\nport=${access.port}\nuser=${access.user}\npassword="${access.password.replace(/["\\]/g, '\\$&')}"\nprotocol=tcp\n`, { mode: 0o600 })
  try {
    const child = spawn(binary, [`--defaults-extra-file=${options}`, ...args], { stdio: ['pipe', 'pipe', 'pipe'] })
    let said = ''
    child.stderr.on('data', (chunk: Buffer) => (said += chunk.toString()))
    const done = new Promise<number | null>(resolve => child.once('close', code => resolve(code)))
    const feeding = io.input ? pipeline(createReadStream(io.input), child.stdin) : Promise.resolve(child.stdin.end())
    const draining = io.output ? pipeline(child.stdout, createWriteStream(io.output)) : Promise.resolve(child.stdout.resume())
    const [code] = await Promise.all([done, feeding, draining])
    if (code !== 0)
      throw new SetupError(`${program} failed (exit ${code}): ${said.trim().split('\n').slice(-3).join(' ')}`)
  }
  finally {
    rmSync(folder, { recursive: true, force: true })
  }
}

/** A consistent dump of one database (one transaction, no table locks), as SQL in a file. */
export async function dumpDatabase(access: DatabaseAccess, file: string): Promise<void> {
  await runClient('mariadb-dump', access, ['--single-transaction', '--quick', '--routines', '--triggers', '--hex-blob', '--no-tablespaces', '--default-character-set=utf8mb4', access.database], { output: file })
}

/** Loads a dump into one database. */
export async function loadDatabase(access: DatabaseAccess, file: string): Promise<void> {
  await runClient('mariadb', access, ['--default-character-set=utf8mb4', access.database], { input: file })
}
