// `npm run size`: the JS and CSS a phone loads before the first screen (gzip level 9) against the
// budget: what index.html loads, and the chunks of the sign-in screen (the first screen of a new
// phone) with everything they import, read from Vite's build manifest. A benchmark: it fails nothing.
import { existsSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { gzipSync } from 'node:zlib'
import { ensureClientBuilt } from './lib/build'
import { repoRoot } from './lib/stack'

const budgetKb = 100
const dist = path.join(repoRoot, 'dist')
const firstScreen = 'src/views/SignInPage.vue'

interface Chunk { file: string, css?: string[], imports?: string[], isEntry?: boolean }

ensureClientBuilt(repoRoot)
const manifest = JSON.parse(readFileSync(path.join(dist, '.vite', 'manifest.json'), 'utf8')) as Record<string, Chunk>
const html = readFileSync(path.join(dist, 'index.html'), 'utf8')
const fromHtml = [...html.matchAll(/<(?:script[^>]+src|link[^>]+href)="\/?([^"]+\.(?:js|css))"/g)].map(match => match[1]!)

/** A chunk's file, its CSS and every chunk it imports statically, once each. */
function withImports(key: string, into: Set<string>): void {
  const chunk = manifest[key]
  if (!chunk || into.has(chunk.file))
    return
  into.add(chunk.file)
  chunk.css?.forEach(css => into.add(css))
  chunk.imports?.forEach(next => withImports(next, into))
}
const files = new Set(fromHtml)
if (!manifest[firstScreen])
  throw new Error(`${firstScreen} is not a chunk of the build: has the sign-in route moved?`)
withImports(firstScreen, files)

const kb = (bytes: number): string => (bytes / 1024).toFixed(1)
let rawTotal = 0
let gzipTotal = 0
console.log('file                                          raw KB   gzip KB')
for (const file of files) {
  const full = path.join(dist, file)
  if (!existsSync(full))
    continue
  const bytes = readFileSync(full)
  const gzipped = gzipSync(bytes, { level: 9 }).length
  rawTotal += bytes.length
  gzipTotal += gzipped
  console.log(`${`/${file}`.padEnd(44)} ${kb(bytes.length).padStart(7)} ${kb(gzipped).padStart(9)}${fromHtml.includes(file) ? '' : '  (sign-in screen)'}`)
}
console.log(`${'before the first screen'.padEnd(44)} ${kb(rawTotal).padStart(7)} ${kb(gzipTotal).padStart(9)}`)
console.log(`budget ${budgetKb} KB gzip: ${gzipTotal / 1024 <= budgetKb ? 'within' : 'OVER'} budget`)
