import type { Browser, BrowserContext, Page } from 'playwright-core'
import { mkdirSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
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
  await page.screenshot({ path: path.join(screenshotDir, `${name}.png`) })
}
