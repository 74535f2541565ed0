import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoOwner, launchBrowser, phoneContext, screenshot, signIn, watchErrors } from './browser'

let browser: Browser
let context: BrowserContext
let page: Page
let errors: string[]

/** Waits until the page Ionic shows has this title (it keeps hidden pages in the DOM). */
const waitForTitle = (p: Page, title: string) => p.locator('.ion-page:not(.ion-page-hidden) ion-title', { hasText: title }).first().waitFor()

beforeAll(async () => {
  browser = await launchBrowser()
  context = await phoneContext(browser)
  page = await context.newPage()
  errors = watchErrors(page)
})
afterAll(async () => {
  await browser?.close()
})

describe('the app shell', () => {
  it('sends a visitor with no identity to the sign-in screen', async () => {
    await page.goto('/ledger')
    await page.waitForURL(url => url.pathname === '/sign-in')
    expect(new URL(page.url()).searchParams.get('redirect')).toBe('/ledger')
    await screenshot(page, 'sign-in')
  })

  it('opens on the Bench tab with six tabs and the network chip', async () => {
    await signIn(page, demoOwner)
    await page.goto('/')
    await waitForTitle(page, 'Bench')
    expect(new URL(page.url()).pathname).toBe('/bench')
    await page.locator('ion-tab-button').nth(5).waitFor()
    const tabs = await page.locator('ion-tab-button').allInnerTexts()
    expect(tabs.map(tab => tab.trim())).toEqual(['Bench', 'Field', 'Zone', 'Ledger', 'Gauges', 'Crew'])
    await expect.poll(() => page.locator('[data-test="network-chip"]').first().innerText()).toContain('Online')
    // Nunito ships with the app; the browser must have loaded it from us.
    await expect.poll(() => page.evaluate(() => document.fonts.check('16px Nunito'))).toBe(true)
    await screenshot(page, 'shell-bench')
  })

  it('moves between tabs', async () => {
    for (const [tab, title] of [['field', 'Field'], ['zone', 'Zone'], ['ledger', 'Ledger'], ['gauges', 'Gauges'], ['crew', 'Crew']] as const) {
      await page.locator(`#tab-button-${tab}`).click()
      await waitForTitle(page, title)
      expect(new URL(page.url()).pathname).toBe(`/${tab}`)
    }
  })

  it('syncs with the team server after signing in', async () => {
    await expect.poll(() => page.locator('[data-test="sync-state"]').innerText(), { timeout: 10_000 }).toBe('Up to date')
    expect(await page.locator('[data-test="sync"]').innerText()).not.toContain('not yet on this phone')
  })

  it('has nothing waiting for a decision on a fresh phone', async () => {
    await page.goto('/crew/attention')
    await page.locator('[data-test="nothing-waiting"]').waitFor()
    await page.goto('/crew')
    await waitForTitle(page, 'Crew')
  })

  it('shows a toast with the team server check', async () => {
    await page.locator('[data-test="check-server"]').click()
    const toast = page.locator('ion-toast')
    await toast.getByText('its database is up').waitFor()
    await screenshot(page, 'crew-toast')
    await toast.evaluate((element: HTMLElement & { dismiss: () => Promise<boolean> }) => element.dismiss())
    await toast.waitFor({ state: 'detached' })
  })

  it('shows an alert and keeps the settings when told to', async () => {
    await page.locator('[data-test="reset-settings"]').click()
    const alert = page.locator('ion-alert')
    await alert.getByText('Reset display settings?').waitFor()
    await screenshot(page, 'crew-alert')
    await alert.getByRole('button', { name: 'Keep' }).click()
    await alert.waitFor({ state: 'detached' })
  })

  it('opens the safety cautions in a modal and closes it', async () => {
    const presented = page.evaluate(() => new Promise<void>(resolve => document.addEventListener('ionModalDidPresent', () => resolve(), { once: true })))
    await page.locator('[data-test="open-cautions"]').click()
    const modal = page.locator('ion-modal')
    await presented
    await modal.getByText('Hot water and steam').waitFor()
    expect(await modal.innerText()).toContain('no figure in Lixivia is a food-safety test')
    await screenshot(page, 'crew-cautions-modal')
    await modal.getByRole('button', { name: 'Close' }).click()
    await modal.waitFor({ state: 'detached' })
  })

  it('switches to dark and keeps it across a reload', async () => {
    await page.locator('[data-test="appearance"] ion-segment-button', { hasText: 'Dark' }).click()
    await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('ion-palette-dark'))).toBe(true)
    await page.reload()
    await waitForTitle(page, 'Crew')
    expect(await page.evaluate(() => document.documentElement.classList.contains('ion-palette-dark'))).toBe(true)
    await screenshot(page, 'crew-dark')
  })

  it('opens with no network after one visit', async () => {
    // The service worker has precached the shell once it is active.
    const active = await page.evaluate(async () => Boolean((await navigator.serviceWorker.ready).active))
    expect(active).toBe(true)
    await context.setOffline(true)
    try {
      await page.goto('/bench')
      await waitForTitle(page, 'Bench')
      await expect.poll(() => page.locator('.ion-page:not(.ion-page-hidden) [data-test="network-chip"]').innerText()).toContain('Offline')
      await expect.poll(() => page.evaluate(() => document.fonts.check('16px Nunito'))).toBe(true)
      // The identity cached on the phone keeps the person signed in without signal.
      await page.locator('#tab-button-crew').click()
      await expect.poll(() => page.locator('[data-test="account-name"]').innerText()).toBe('Ines Marwood')
      // The API is never answered from the cache: offline it fails.
      const apiFailed = await page.evaluate(() => fetch('/api/v1/health').then(() => false, () => true))
      expect(apiFailed).toBe(true)
      await screenshot(page, 'offline-bench')
    }
    finally {
      await context.setOffline(false)
    }
  })

  it('threw no uncaught errors', () => {
    expect(errors).toEqual([])
  })
})
