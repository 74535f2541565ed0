import type { Browser, BrowserContext, Page } from 'playwright-core'
import type { FakeSmtp } from '../../server/mail/fake-smtp'
import type { ServeProcess } from './serve-stack'
import { execFileSync } from 'node:child_process'
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { chromium } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { freePort, processAlive } from '../../scripts/lib/system'
import { startFakeSmtp } from '../../server/mail/fake-smtp'
import { accessibilityProblems, addReading, fillField, onScreen, screenshot, signIn, watchErrors } from './browser'
import { httpsJson, jsonLines, startServe } from './serve-stack'
import { readTerminalQr } from './terminal-qr'

// The venue set-up for real, on loopback: `npm run serve` with Caddy's own authority for a laptop
// named lixivia-venue.test, which Chromium resolves to 127.0.0.1. The phone is Chromium with that
// authority trusted in its own certificate store (NSS, as Chromium on Linux reads it), not told to
// ignore certificate errors: the service worker needs a certificate the browser trusts.

const host = 'lixivia-venue.test'
const member = { email: 'mats@kestrel-quay.test', password: 'kestrel-demo-2026' }
const folder = mkdtempSync(path.join(os.tmpdir(), 'lixivia-venue-'))
const ports = { PORT: 0, DB_PORT: 0, HTTPS_PORT: 0, HTTP_PORT: 0 }
let smtp: FakeSmtp
let serve: ServeProcess
let rootPem: string
const browsers: Browser[] = []

/** Chromium as a phone on the venue's Wi-Fi: it finds the laptop by name; HOME holds its certificate store. */
async function phone(home: string | undefined, baseURL?: string): Promise<BrowserContext> {
  const browser = await chromium.launch({
    executablePath: inject('chromiumPath'),
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', `--host-resolver-rules=MAP ${host} 127.0.0.1`],
    env: { ...process.env, ...(home ? { HOME: home } : {}) },
  })
  browsers.push(browser)
  const context = await browser.newContext({ baseURL, viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, hasTouch: true, isMobile: true, acceptDownloads: true })
  context.setDefaultTimeout(15_000)
  return context
}

beforeAll(async () => {
  smtp = await startFakeSmtp({ port: 0, mailDir: path.join(folder, 'mail') })
  for (const key of Object.keys(ports) as (keyof typeof ports)[])
    ports[key] = await freePort()
  serve = await startServe({ ...ports, DATA_DIR: path.join(folder, 'data'), PROXY_BIND: '127.0.0.1', VENUE_ADDRESS: host, SMTP_HOST: '127.0.0.1', SMTP_PORT: smtp.port, MAIL_FROM: 'Lixivia <crew@kestrel-quay.test>', DEMO_DATA: 'true' })
})
afterAll(async () => {
  await Promise.all(browsers.map(browser => browser.close()))
  const code = await serve?.stop()
  await smtp?.close()
  rmSync(folder, { recursive: true, force: true })
  expect(code).toBe(0)
})

describe('npm run serve at a venue', () => {
  it('logs JSON lines on stdout and draws the phone page\'s address as a QR code for the terminal', async () => {
    const lines = jsonLines(serve.stdout())
    expect(lines.some(line => line.msg === 'Lixivia is ready')).toBe(true)
    expect(serve.ready.url).toBe(`https://${host}:${ports.HTTPS_PORT}/`)
    expect(serve.ready.phonePage).toBe(`http://${host}:${ports.HTTP_PORT}/phone`)
    // stderr is a pipe of its own: the drawing may arrive a moment after the ready line.
    await expect.poll(() => readTerminalQr(serve.stderr())).toBe(serve.ready.phonePage)
  })

  it('serves the phone page and the root certificate over plain HTTP, before a phone trusts anything', async () => {
    const context = await phone(undefined)
    const page = await context.newPage()
    await page.goto(serve.ready.phonePage)
    expect(await page.locator('[data-test="address"]').innerText()).toBe(serve.ready.url)
    expect(await page.locator('[data-test="fingerprint"]').innerText()).toBe(serve.ready.rootFingerprint)
    expect(await accessibilityProblems(page)).toEqual([])
    await screenshot(page, 'venue-phone-page')
    const [download] = await Promise.all([page.waitForEvent('download'), page.locator('[data-test="download-root"]').click()])
    expect(download.suggestedFilename()).toBe('lixivia-venue-root.crt')
    rootPem = readFileSync((await download.path())!, 'utf8')
    expect(rootPem).toBe(readFileSync(path.join(folder, 'data', 'caddy', 'data', 'pki', 'authorities', 'local', 'root.crt'), 'utf8'))
    // Untrusted, the HTTPS address is refused: that is why the page exists.
    await expect(page.goto(serve.ready.url)).rejects.toThrow(/ERR_CERT_AUTHORITY_INVALID/)
  })

  describe('a phone that trusts the venue\'s certificate', () => {
    let context: BrowserContext
    let page: Page
    let errors: string[]

    beforeAll(async () => {
      const home = path.join(folder, 'phone-home')
      const store = path.join(home, '.pki', 'nssdb')
      mkdirSync(store, { recursive: true })
      const rootFile = path.join(folder, 'venue-root.crt')
      writeFileSync(rootFile, rootPem)
      execFileSync('certutil', ['-d', `sql:${store}`, '-N', '--empty-password'])
      execFileSync('certutil', ['-d', `sql:${store}`, '-A', '-t', 'C,,', '-n', 'Lixivia venue root', '-i', rootFile])
      context = await phone(home, serve.ready.url)
      page = await context.newPage()
      errors = watchErrors(page)
    })

    it('opens the app over HTTPS as a secure context and installs its service worker', async () => {
      await page.goto('/')
      expect(await page.evaluate(() => ({ secure: window.isSecureContext, protocol: location.protocol }))).toEqual({ secure: true, protocol: 'https:' })
      await expect.poll(() => page.evaluate(async () => Boolean((await navigator.serviceWorker.ready).active)), { timeout: 20_000 }).toBe(true)
    })

    it('signs in, measures a brew without signal and syncs it once the laptop is in reach', async () => {
      await signIn(page, member)
      await page.goto('/bench')
      await onScreen(page, 'result').getByText('Add at least one reading.').waitFor()
      await context.setOffline(true)
      // Without signal the service worker opens the app again.
      await page.reload()
      await onScreen(page, 'result').getByText('Add at least one reading.').waitFor()
      await fillField(page, 'dose-gross', '27.5')
      await fillField(page, 'dose-tare', '12.5')
      await fillField(page, 'beverage-gross', '652.6')
      await fillField(page, 'beverage-tare', '412.6')
      await addReading(page, '1.35')
      await fillField(page, 'notes', 'venue spec pour')
      await expect.poll(() => onScreen(page, 'tds').innerText()).toBe('1.35')
      await onScreen(page, 'save-brew').click()
      const row = () => onScreen(page, 'recent-brews').locator('ion-item').first()
      await expect.poll(() => row().innerText()).toContain('Waiting to sync')
      await screenshot(page, 'venue-offline-brew')
      await context.setOffline(false)
      await expect.poll(() => row().innerText(), { timeout: 20_000 }).toContain('Synced')

      const login = await httpsJson<{ accessToken: string }>({ port: ports.HTTPS_PORT, host, ca: rootPem, method: 'POST', path: '/api/v1/auth/login', body: member })
      expect(login.status).toBe(200)
      const me = await httpsJson<{ memberships: { teamId: string }[] }>({ port: ports.HTTPS_PORT, host, ca: rootPem, path: '/api/v1/me', token: login.body.accessToken })
      const teamId = me.body.memberships[0]!.teamId
      const pulled = await httpsJson<{ changes: { entity: string, data: { notes?: string, derived?: { tdsPercent: number } } }[] }>({ port: ports.HTTPS_PORT, host, ca: rootPem, path: `/api/v1/sync/pull?teamId=${teamId}&limit=1000`, token: login.body.accessToken })
      const brew = pulled.body.changes.find(change => change.entity === 'brew' && change.data.notes === 'venue spec pour')
      expect(brew?.data.derived?.tdsPercent).toBeCloseTo(1.35, 6)
      expect(errors).toEqual([])
    })
  })

  it('stops Caddy, the app and its MariaDB on SIGTERM', async () => {
    const caddyPid = Number(readFileSync(path.join(folder, 'data', 'caddy', 'caddy.pid'), 'utf8'))
    expect(processAlive(caddyPid)).toBe(true)
    expect(await serve.stop()).toBe(0)
    expect(processAlive(caddyPid)).toBe(false)
    expect(existsSync(path.join(folder, 'data', 'caddy', 'caddy.pid'))).toBe(false)
  })
})
