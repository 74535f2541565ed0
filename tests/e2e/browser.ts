import type { Browser, BrowserContext, Locator, Page } from 'playwright-core'
import { mkdirSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import axe from 'axe-core'
import { chromium } from 'playwright-core'
import { inject } from 'vitest'

export const screenshotDir = fileURLToPath(new URL('./screenshots', import.meta.url))

/**
 * Debian's Chromium, headless. Background networking and component updates are off because this
 * machine has no network beyond loopback; the sandbox is off because tests may run as root.
 */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: inject('chromiumPath'),
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  })
}

/** A phone-sized context (390 × 844, touch) on the app under test. */
export async function phoneContext(browser: Browser): Promise<BrowserContext> {
  const context = await browser.newContext({ baseURL: inject('baseUrl'), viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, hasTouch: true, isMobile: true })
  context.setDefaultTimeout(10_000)
  return context
}

/** Collects uncaught page errors so a test can assert there were none. */
export function watchErrors(page: Page): string[] {
  const errors: string[] = []
  page.on('pageerror', error => errors.push(error.message))
  return errors
}

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(screenshotDir, { recursive: true })
  // Page transitions and floating field labels come to rest first.
  await page.waitForTimeout(500)
  await page.screenshot({ path: path.join(screenshotDir, `${name}.png`) })
}

/** The seeded demo owner (server/db/seed.ts), printed by npm start. */
export const demoOwner = { email: 'ines@kestrel-quay.test', password: 'kestrel-demo-2026' }

/** A data-test element on the page Ionic is showing (it keeps earlier pages, hidden, in the DOM). */
export const onScreen = (page: Page, name: string) => page.locator(`[data-test="${name}"]`).filter({ visible: true })

/** Types into an Ionic text field found by its data-test name. */
export async function fillField(page: Page, name: string, value: string): Promise<void> {
  const field = onScreen(page, name).locator('input')
  // During a page transition the leaving page is still visible for a moment.
  for (let waited = 0; (await field.count()) !== 1 && waited < 5000; waited += 50)
    await page.waitForTimeout(50)
  await field.fill(value)
}

/** Signs in through the sign-in screen and waits for the app behind it. */
export async function signIn(page: Page, account: { email: string, password: string }): Promise<void> {
  await page.goto('/sign-in')
  await fillField(page, 'email', account.email)
  await fillField(page, 'password', account.password)
  await onScreen(page, 'submit').click()
  await page.waitForURL(url => !url.pathname.startsWith('/sign-in'))
}

/** Reads the newest message the local SMTP fake caught for an address, through the dev route. */
export async function newestMailTo(page: Page, address: string): Promise<{ subject: string, text: string, attachments?: { filename: string, contentType: string, content: string }[] }> {
  for (let attempt = 0; attempt < 50; attempt++) {
    const list = await (await page.request.get('/api/v1/dev/mail')).json() as { mails: { id: string, to: string[] }[] }
    const found = list.mails.find(mail => mail.to.includes(address))
    if (found)
      return (await page.request.get(`/api/v1/dev/mail/${found.id}`)).json()
    await page.waitForTimeout(100)
  }
  throw new Error(`no mail to ${address}`)
}

/** Waits until the page Ionic shows has this title (it keeps hidden pages in the DOM). */
export const waitForTitle = (page: Page, title: string) => page.locator('.ion-page:not(.ion-page-hidden) ion-title', { hasText: title }).first().waitFor()

/**
 * Runs axe-core (WCAG 2.x A and AA rules) on what the page shows and returns the serious and
 * critical violations, each as "rule: where". Evaluated through the driver, so the app's
 * Content-Security-Policy does not block it.
 */
export async function accessibilityProblems(page: Page): Promise<string[]> {
  await page.waitForTimeout(400)
  if (!(await page.evaluate(() => 'axe' in window)))
    await page.evaluate(axe.source)
  const violations = await page.evaluate(async () => {
    const run = (window as unknown as { axe: typeof axe }).axe.run
    // A toast fading in or out is measured mid-animation at a fraction of its contrast; toasts keep
    // Ionic's own colours (#f2f2f2 on #333333, 11.3:1) and are left out of the pass.
    const result = await run({ exclude: [['ion-toast']] }, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] })
    return result.violations.map(v => ({ id: v.id, impact: v.impact, targets: v.nodes.slice(0, 3).map(node => String(node.target.join(' '))) }))
  })
  return violations.filter(v => v.impact === 'serious' || v.impact === 'critical').map(v => `${v.id}: ${v.targets.join(' | ')}`)
}

/** Adds a reading on the measure form. */
export async function addReading(page: Page, value: string): Promise<void> {
  await fillField(page, 'reading', value)
  await onScreen(page, 'add-reading').click()
}

/** Taps the back button of the screen Ionic shows. */
export async function goBack(page: Page): Promise<void> {
  await page.locator('.ion-page:not(.ion-page-hidden) ion-back-button').click()
}

/**
 * Taps the one point drawn in this colour on the control chart: its pixels are found on the canvas
 * (opaque, exactly that colour) and tapped at their centre.
 */
export async function tapChartPoint(page: Page, rgb: [number, number, number]): Promise<void> {
  const canvas = onScreen(page, 'control-chart').locator('canvas')
  const spot = await canvas.evaluate((element: HTMLCanvasElement, [r, g, b]) => {
    const { data, width } = element.getContext('2d')!.getImageData(0, 0, element.width, element.height)
    let x = 0
    let y = 0
    let n = 0
    for (let i = 0; i < data.length; i += 4) {
      if (data[i] === r && data[i + 1] === g && data[i + 2] === b && data[i + 3] === 255) {
        x += (i / 4) % width
        y += Math.floor(i / 4 / width)
        n += 1
      }
    }
    return n ? { x: (x / n) * element.clientWidth / element.width, y: (y / n) * element.clientHeight / element.height } : null
  }, rgb)
  if (!spot)
    throw new Error(`No point of colour ${rgb.join(', ')} on the chart.`)
  await canvas.click({ position: spot })
}

/**
 * Scrolls the Ledger a screen at a time until `row` is in the page or the list ends: the Ledger
 * renders a window of rows (a year of brews), so a row further down exists only once scrolled to.
 */
export async function scrollLedgerTo(page: Page, row: Locator): Promise<void> {
  for (let step = 0; step < 60 && (await row.count()) === 0; step++) {
    const moved = await page.evaluate(async () => {
      const content = Array.from(document.querySelectorAll('ion-content')).find(el => !el.closest('.ion-page-hidden') && el.querySelector('[data-test="ledger-list"]')) as (HTMLElement & { getScrollElement: () => Promise<HTMLElement> }) | undefined
      const scroller = await content?.getScrollElement()
      if (!scroller)
        return false
      const before = scroller.scrollTop
      scroller.scrollBy(0, scroller.clientHeight * 0.8)
      return scroller.scrollTop !== before
    })
    await page.waitForTimeout(150)
    if (!moved)
      return
  }
}
