// `npm run size`: what index.html makes the browser load before the first screen (JS and CSS,
// gzip level 9), against the budget. A benchmark that prints figures; it fails nothing.
import { existsSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { gzipSync } from 'node:zlib'
import { ensureClientBuilt } from './lib/build'
import { repoRoot } from './lib/stack'

const budgetKb = 130
const aimKb = 100
const dist = path.join(repoRoot, 'dist')

ensureClientBuilt(repoRoot)
const html = readFileSync(path.join(dist, 'index.html'), 'utf8')
const refs = [...html.matchAll(/<(?:script[^>]+src|link[^>]+href)="([^"]+\.(?:js|css))"/g)].map(match => match[1]!)
const kb = (bytes: number): string => (bytes / 1024).toFixed(1)

let rawTotal = 0
let gzipTotal = 0
console.log('file                                          raw KB   gzip KB')
for (const ref of refs) {
  const file = path.join(dist, ref.replace(/^\//, ''))
  if (!existsSync(file))
    continue
  const bytes = readFileSync(file)
  const gzipped = gzipSync(bytes, { level: 9 }).length
  rawTotal += bytes.length
  gzipTotal += gzipped
  console.log(`${ref.padEnd(44)} ${kb(bytes.length).padStart(7)} ${kb(gzipped).padStart(9)}`)
}
console.log(`${'before the first screen'.padEnd(44)} ${kb(rawTotal).padStart(7)} ${kb(gzipTotal).padStart(9)}`)
console.log(`budget ${budgetKb} KB gzip (aim ${aimKb}): ${gzipTotal / 1024 <= budgetKb ? 'within' : 'OVER'} budget`)
