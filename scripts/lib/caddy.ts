import type { ChildProcess } from 'node:child_process'
import type { ProxySite } from './caddyfile'
import { spawn } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import https from 'node:https'
import net from 'node:net'
import path from 'node:path'
import { createInterface } from 'node:readline'
import { setTimeout as sleep } from 'node:timers/promises'
import { caddyfileFor, venueRootFile } from './caddyfile'
import { assertPortFree, ensureDebianPackage, processAlive, SetupError } from './system'

export interface RunningCaddy {
  pid: number
  caddyfile: string
  /** The venue authority's root certificate (PEM), once Caddy made it; null in public mode. */
  rootCertificate: string | null
  stop: () => Promise<void>
}

/** Caddy's own folders under DATA_DIR/caddy: its Caddyfile, its storage, and its XDG homes. */
export function caddyPaths(dataDir: string) {
  const root = path.join(dataDir, 'caddy')
  return { root, caddyfile: path.join(root, 'Caddyfile'), storage: path.join(root, 'data'), config: path.join(root, 'config'), pidFile: path.join(root, 'caddy.pid') }
}

/** A Caddy that an earlier `npm run serve` killed with -9 left running still holds the ports. */
async function stopEarlierCaddy(pidFile: string, caddyfile: string): Promise<void> {
  if (!existsSync(pidFile))
    return
  const pid = Number.parseInt(readFileSync(pidFile, 'utf8'), 10)
  const ours = (): boolean => {
    try {
      return readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').includes(caddyfile)
    }
    catch {
      return false
    }
  }
  if (Number.isInteger(pid) && processAlive(pid) && ours()) {
    process.kill(pid, 'SIGTERM')
    for (let waited = 0; processAlive(pid) && waited < 10_000; waited += 100)
      await sleep(100)
  }
  rmSync(pidFile, { force: true })
}

/** Resolves once the site answers over HTTPS with a chain that ends in the venue's own root. */
async function answersWithVenueChain(site: ProxySite, ca: string): Promise<boolean> {
  return new Promise((resolve) => {
    const request = https.get({ host: site.bind ?? '127.0.0.1', port: site.httpsPort, servername: site.hosts[0], headers: { host: site.hosts[0] }, path: '/api/v1/health', ca, timeout: 2_000 }, (response) => {
      response.resume()
      resolve(true)
    })
    request.once('error', () => resolve(false))
    request.once('timeout', () => request.destroy())
  })
}

function listening(host: string, port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ host, port }, () => {
      socket.end()
      resolve(true)
    })
    socket.once('error', () => resolve(false))
  })
}

async function waitUntilServing(child: ChildProcess, site: ProxySite, storage: string): Promise<string | null> {
  const deadline = Date.now() + 60_000
  while (Date.now() < deadline) {
    if (child.exitCode !== null || child.signalCode !== null)
      throw new SetupError(`Caddy stopped while starting (exit ${child.exitCode ?? child.signalCode}); its log lines above say why.`)
    if (site.mode === 'public') {
      // The public certificate may take a while; Caddy serves as soon as it has one.
      if (await listening(site.bind ?? '127.0.0.1', site.httpsPort))
        return null
    }
    else if (existsSync(venueRootFile(storage))) {
      const root = readFileSync(venueRootFile(storage), 'utf8')
      if (await answersWithVenueChain(site, root))
        return root
    }
    await sleep(200)
  }
  child.kill('SIGKILL')
  throw new SetupError('Caddy did not serve HTTPS within 60 s; its log lines above say why.')
}

/**
 * Writes the Caddyfile into DATA_DIR/caddy and runs Debian's Caddy on it as a child process, its
 * log lines (JSON) passed to `log`. Resolves once the site answers over HTTPS.
 */
export async function startCaddy(dataDir: string, site: Omit<ProxySite, 'storageDir'>, log: (line: string) => void): Promise<RunningCaddy> {
  const caddy = ensureDebianPackage('caddy', 'caddy', 'HTTPS in front of the app')
  const paths = caddyPaths(dataDir)
  mkdirSync(paths.config, { recursive: true })
  const full: ProxySite = { ...site, storageDir: paths.storage }
  writeFileSync(paths.caddyfile, caddyfileFor(full))
  await stopEarlierCaddy(paths.pidFile, paths.caddyfile)
  await assertPortFree(site.httpsPort, 'HTTPS_PORT', site.bind ?? '0.0.0.0')
  await assertPortFree(site.httpPort, 'HTTP_PORT', site.bind ?? '0.0.0.0')

  const child = spawn(caddy, ['run', '--config', paths.caddyfile, '--adapter', 'caddyfile'], {
    // Caddy keeps an autosaved config under its XDG folders: those stay in DATA_DIR too.
    env: { ...process.env, XDG_DATA_HOME: paths.storage, XDG_CONFIG_HOME: paths.config },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  writeFileSync(paths.pidFile, `${child.pid}\n`)
  for (const stream of [child.stdout, child.stderr])
    createInterface({ input: stream! }).on('line', log)
  const exited = new Promise<void>(resolve => child.once('exit', () => resolve()))
  const rootCertificate = await waitUntilServing(child, full, paths.storage)
  return {
    pid: child.pid ?? 0,
    caddyfile: paths.caddyfile,
    rootCertificate,
    async stop() {
      if (child.exitCode === null && child.signalCode === null) {
        child.kill('SIGTERM')
        const killer = setTimeout(() => child.kill('SIGKILL'), 10_000)
        await exited
        clearTimeout(killer)
      }
      rmSync(paths.pidFile, { force: true })
    },
  }
}
