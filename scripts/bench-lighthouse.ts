// `npm run bench:lighthouse`: Lighthouse (its default mobile profile: a mid-range phone, simulated
// slow 4G and 4× CPU) on the sign-in screen of the built app, served as in production over a
// throwaway MariaDB, in Debian's Chromium. Prints the scores and timings beside their targets. A
// benchmark: it prints, it fails nothing.
import type { Flags } from 'lighthouse'
import { fork } from 'node:child_process'
import { once } from 'node:events'
import { mkdtempSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import * as chromeLauncher from 'chrome-launcher'
import lighthouse from 'lighthouse'
import { runMigrations } from '../server/db/migrate'
import { ensureClientBuilt } from './lib/build'
import { startMariaDb } from './lib/mariadb'
import { repoRoot } from './lib/stack'
import { ensureDebianPackage, freePort } from './lib/system'

ensureClientBuilt(repoRoot)
const chromePath = process.env.CHROME_PATH ?? ensureDebianPackage('chromium', 'chromium', 'Lighthouse')
const dataDir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-lighthouse-'))
const server = await startMariaDb({ dataDir, port: await freePort(), ephemeral: true })
const url = await server.provisionUser('bench', 'bench-only-password', 'lixivia_bench')
await runMigrations(url)
const app = fork(new URL('./lib/bench-app.ts', import.meta.url), { execArgv: ['--import', 'tsx'], env: { ...process.env, BENCH_DATABASE_URL: url, BENCH_STATIC_DIR: path.join(repoRoot, 'dist') } })
// The machine has no network beyond loopback: nothing in the background may try to reach out.
const chrome = await chromeLauncher.launch({ chromePath, chromeFlags: ['--headless=new', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'] })
try {
  const [{ port }] = await once(app, 'message') as [{ port: number }]
  const flags: Flags = { port: chrome.port, output: 'json', logLevel: 'error', onlyCategories: ['performance', 'accessibility', 'best-practices'] }
  const result = await lighthouse(`http://127.0.0.1:${port}/sign-in`, flags)
  if (!result)
    throw new Error('Lighthouse gave no result.')
  const { categories, audits } = result.lhr
  const score = (id: string) => categories[id]?.score ?? null
  const ms = (id: string) => audits[id]?.numericValue ?? null
  const row = (name: string, value: string, target: string, ok: boolean | null) => console.log(`${name.padEnd(34)} ${value.padStart(10)}   ${target.padEnd(10)} ${ok === null ? '' : ok ? 'ok' : 'MISSED'}`)
  const seconds = (value: number | null) => (value === null ? '—' : `${(value / 1000).toFixed(2)} s`)
  console.log(`Lighthouse ${result.lhr.lighthouseVersion}, ${result.lhr.configSettings.formFactor} profile, on /sign-in\n`)
  if (result.lhr.runtimeError)
    console.log(`Lighthouse could not measure the page: ${result.lhr.runtimeError.code} ${result.lhr.runtimeError.message}`)
  const broken = ['first-contentful-paint', 'largest-contentful-paint'].map(id => audits[id]).filter(audit => audit?.errorMessage)
  broken.forEach(audit => console.log(`${audit!.id}: ${audit!.errorMessage}`))
  row('performance', String(score('performance')), '≥ 0.95', (score('performance') ?? 0) >= 0.95)
  row('accessibility', String(score('accessibility')), '1.0', score('accessibility') === 1)
  row('best practices', String(score('best-practices')), '', null)
  row('first contentful paint', seconds(ms('first-contentful-paint')), '', null)
  row('largest contentful paint', seconds(ms('largest-contentful-paint')), '≤ 2.5 s', (ms('largest-contentful-paint') ?? Infinity) <= 2500)
  row('total blocking time', `${Math.round(ms('total-blocking-time') ?? 0)} ms`, '', null)
  row('cumulative layout shift', String((ms('cumulative-layout-shift') ?? 0).toFixed(3)), '', null)
  row('speed index', seconds(ms('speed-index')), '', null)
  const saving = (id: string) => audits[id]?.details && 'overallSavingsBytes' in audits[id].details! ? Number(audits[id].details!.overallSavingsBytes) : 0
  row('to save by text compression', `${(saving('uses-text-compression') / 1024).toFixed(0)} KiB`, '', null)
  row('unused JavaScript', `${(saving('unused-javascript') / 1024).toFixed(0)} KiB`, '', null)
  const lcpElement = audits['largest-contentful-paint-element']?.details
  if (process.env.BENCH_VERBOSE && lcpElement)
    console.log(JSON.stringify(lcpElement, null, 1).slice(0, 3000))
  const failing = Object.values(audits).filter(audit => audit.score !== null && audit.score < 1 && result.lhr.categories.accessibility?.auditRefs.some(ref => ref.id === audit.id))
  if (failing.length)
    console.log(`accessibility audits not passed: ${failing.map(audit => audit.id).join(', ')}`)
}
finally {
  chrome.kill()
  app.disconnect()
  await once(app, 'exit')
  await server.stop()
  rmSync(dataDir, { recursive: true, force: true })
}
