import { spawnSync } from 'node:child_process'
import { existsSync, readdirSync, statSync } from 'node:fs'
import { createRequire } from 'node:module'
import path from 'node:path'
import { SetupError } from './system'

const sources = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'package.json', 'package-lock.json']

function newestMtime(entry: string): number {
  if (!existsSync(entry))
    return 0
  const stat = statSync(entry)
  if (!stat.isDirectory())
    return stat.mtimeMs
  let newest = stat.mtimeMs
  for (const child of readdirSync(entry))
    newest = Math.max(newest, newestMtime(path.join(entry, child)))
  return newest
}

/** Vite's command-line entry (its package exports do not include the bin file). */
export function viteBin(root: string): string {
  const manifest = createRequire(path.join(root, 'package.json')).resolve('vite/package.json')
  return path.join(path.dirname(manifest), 'bin', 'vite.js')
}

/** Builds the client with Vite when `dist/` is missing or older than any of its sources. */
/** `log` tells what happens; the build's own output goes to stderr when `quiet` (stdout holds JSON lines). */
export function ensureClientBuilt(root: string, options: { log?: (line: string) => void, quiet?: boolean } = {}): void {
  const log = options.log ?? ((line: string) => console.log(line))
  const built = path.join(root, 'dist', 'index.html')
  const builtAt = existsSync(built) ? statSync(built).mtimeMs : 0
  const changedAt = Math.max(...sources.map(entry => newestMtime(path.join(root, entry))))
  if (builtAt > changedAt)
    return
  log(builtAt ? 'The client sources changed since the last build: building ...' : 'Building the client ...')
  // The client is always built for production: with NODE_ENV=development in the environment (as in
  // development or the browser tests) Vite would bundle Vue's development build, 40 KB gzip heavier.
  const result = spawnSync(process.execPath, [viteBin(root), 'build', '--logLevel', 'warn'], { cwd: root, stdio: options.quiet ? ['ignore', process.stderr, process.stderr] : 'inherit', env: { ...process.env, NODE_ENV: 'production' } })
  if (result.status !== 0)
    throw new SetupError('The client build failed (see above); fix it, or run `npm run build` to see the whole output.')
}
