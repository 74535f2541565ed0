import { spawnSync } from 'node:child_process'
import { existsSync, readFileSync } from 'node:fs'
import net from 'node:net'
import path from 'node:path'

/** A problem the person at the terminal can fix; printed as one line, without a stack trace. */
export class SetupError extends Error {
  override name = 'SetupError'
}

const searchDirs = (): string[] => [...(process.env.PATH ?? '').split(path.delimiter), '/usr/sbin', '/usr/bin', '/sbin']

/** The absolute path of a program on PATH (or in the sbin folders Debian uses for servers). */
export function findProgram(name: string): string | undefined {
  for (const dir of searchDirs()) {
    const candidate = path.join(dir, name)
    if (dir && existsSync(candidate))
      return candidate
  }
  return undefined
}

export const isRoot = (): boolean => process.getuid?.() === 0

/**
 * Makes sure a Debian package that provides `program` is installed: as root it runs apt-get
 * (updating the lists once if the first attempt fails); otherwise it stops with the command to run.
 */
export function ensureDebianPackage(program: string, pkg: string, why: string): string {
  const found = findProgram(program)
  if (found)
    return found
  if (!isRoot())
    throw new SetupError(`${why} needs Debian's ${pkg} package: run \`sudo apt-get install -y ${pkg}\` and try again.`)
  console.log(`Installing Debian's ${pkg} package (${why}) ...`)
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
  const install = (): number | null => spawnSync('apt-get', ['install', '-y', '-qq', pkg], { stdio: 'inherit', env }).status
  if (install() !== 0) {
    spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env })
    if (install() !== 0)
      throw new SetupError(`apt-get could not install ${pkg}: install it by hand (\`apt-get install -y ${pkg}\`) and try again.`)
  }
  const installed = findProgram(program)
  if (!installed)
    throw new SetupError(`${pkg} was installed but ${program} is still not found on PATH.`)
  return installed
}

/** Resolves when nothing listens on host:port, rejects with a SetupError naming the variable otherwise. */
export async function assertPortFree(port: number, variable: string, host = '127.0.0.1'): Promise<void> {
  await new Promise<void>((resolve, reject) => {
    const probe = net.createServer()
    probe.once('error', (error: NodeJS.ErrnoException) => {
      if (error.code === 'EADDRINUSE')
        reject(new SetupError(`Port ${port} on ${host} is already in use (${variable}). Stop the program using it or set ${variable} to a free port.`))
      else if (error.code === 'EACCES')
        reject(new SetupError(`Port ${port} on ${host} needs privileges this user lacks (${variable}); choose a port above 1023.`))
      else
        reject(error)
    })
    probe.listen({ port, host, exclusive: true }, () => probe.close(() => resolve()))
  })
}

/** A port the OS reports free right now on loopback (for tests and throwaway servers). */
export async function freePort(): Promise<number> {
  return await new Promise((resolve, reject) => {
    const probe = net.createServer()
    probe.once('error', reject)
    probe.listen({ port: 0, host: '127.0.0.1' }, () => {
      const address = probe.address()
      const port = typeof address === 'object' && address ? address.port : 0
      probe.close(() => resolve(port))
    })
  })
}

/** A process's state letter and parent pid, read from /proc (Linux); undefined when unreadable. */
export function processStat(pid: number): { state: string, ppid: number } | undefined {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8')
    // The command name sits in parentheses and may hold spaces; the fields after it are fixed.
    const [state, ppid] = stat.slice(stat.lastIndexOf(')') + 2).split(' ')
    return state && ppid ? { state, ppid: Number(ppid) } : undefined
  }
  catch {
    return undefined
  }
}

/**
 * True when a process with this pid exists and has not exited (signal 0 only asks). A zombie has
 * exited: it only waits for a parent to reap it, which in a container may never come.
 */
export function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0)
  }
  catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EPERM')
      return false
  }
  return processStat(pid)?.state !== 'Z'
}
