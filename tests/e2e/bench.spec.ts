import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { addReading, fillField, launchBrowser, onScreen, phoneContext, screenshot, signIn, watchErrors } from './browser'

// Seeded demo accounts (server/db/seed.ts): a member measures, a lead on another phone reads.
const member = { email: 'mats@kestrel-quay.test', password: 'kestrel-demo-2026' }
const lead = { email: 'tobiah@kestrel-quay.test', password: 'kestrel-demo-2026' }

let browser: Browser
let context: BrowserContext
let page: Page
let errors: string[]

beforeAll(async () => {
  browser = await launchBrowser()
  context = await phoneContext(browser)
  page = await context.newPage()
  errors = watchErrors(page)
  await signIn(page, member)
})
afterAll(async () => {
  await browser?.close()
})

describe('measuring a brew on the Bench', () => {
  it('computes strength, extraction and the verdict live from gross and tare weights and three readings', async () => {
    await page.goto('/bench')
    await onScreen(page, 'result').getByText('Add at least one reading.').waitFor()
    // The handbook's worked pour-over: 15.0 g of coffee, 240.0 g of beverage, 1.35 %TDS → 21.6 %.
    await fillField(page, 'dose-gross', '27.5')
    await fillField(page, 'dose-tare', '12.5')
    await fillField(page, 'beverage-gross', '652.6')
    await fillField(page, 'beverage-tare', '412.6')
    await addReading(page, '1.34')
    await addReading(page, '1.35')
    await addReading(page, '1,36')
    await fillField(page, 'notes', 'bench spec pour')
    await expect.poll(() => onScreen(page, 'tds').innerText()).toBe('1.35')
    expect(await onScreen(page, 'ey').innerText()).toBe('21.6')
    expect(await onScreen(page, 'net').innerText()).toContain('dose 15.0 g, beverage 240.0 g')
    expect(await onScreen(page, 'verdict').innerText()).toContain('In the zone')
    await screenshot(page, 'bench-result')
  })

  it('flags a field that is not a number beside it', async () => {
    await fillField(page, 'dose-tare', '12..5')
    await onScreen(page, 'dose-tare').getByText('Type a number of grams').waitFor()
    await fillField(page, 'dose-tare', '12.5')
  })

  it('saves offline at once, keeps it across a reload and a new page, and sends it when signal returns', async () => {
    await context.setOffline(true)
    await onScreen(page, 'save-brew').click()
    const row = () => onScreen(page, 'recent-brews').locator('ion-item').first()
    await expect.poll(() => row().innerText()).toContain('Waiting to sync')
    expect(await row().innerText()).toContain('1.35 %TDS · 21.6 % EY')
    await page.reload()
    await expect.poll(() => row().innerText()).toContain('Waiting to sync')
    await page.close()
    page = await context.newPage()
    errors = watchErrors(page)
    await page.goto('/bench')
    await expect.poll(() => row().innerText()).toContain('Waiting to sync')
    await screenshot(page, 'bench-offline-waiting')

    await context.setOffline(false)
    await expect.poll(() => row().innerText(), { timeout: 15_000 }).toContain('Synced')
  })

  it('reaches another member of the team on their own phone', async () => {
    const other = await (await phoneContext(browser)).newPage()
    await signIn(other, lead)
    await other.goto('/bench')
    const row = onScreen(other, 'recent-brews').locator('ion-item').first()
    await expect.poll(() => row.innerText(), { timeout: 15_000 }).toContain('1.35 %TDS · 21.6 % EY')
    expect(await row.innerText()).toContain('Synced')
  })

  it('lists it in the Ledger, filters it and exports the list as CSV', async () => {
    await page.goto('/ledger')
    const list = onScreen(page, 'ledger-list')
    await fillField(page, 'filter-search', 'bench spec')
    await expect.poll(() => list.locator('ion-item').count()).toBe(1)
    expect(await list.innerText()).toContain('1.35 %TDS · 21.6 % EY')
    // The brew found is in the US zone, so outside it nothing matches.
    await onScreen(page, 'filter-toggle').click()
    await onScreen(page, 'filter-zone').locator('ion-segment-button', { hasText: 'Outside' }).click()
    await page.getByText('No brew matches these filters.').waitFor()
    expect(await onScreen(page, 'filter-toggle').innerText()).toMatch(/Filters · 1/i)
    expect(await list.locator('ion-item').count()).toBe(0)
    await onScreen(page, 'filter-zone').locator('ion-segment-button', { hasText: 'In zone' }).click()
    await expect.poll(() => list.locator('ion-item').count()).toBeGreaterThan(0)
    expect(await list.innerText()).not.toContain('Outside')
    const [download] = await Promise.all([page.waitForEvent('download'), onScreen(page, 'export-csv').click()])
    const csv = (await import('node:fs')).readFileSync((await download.path())!, 'utf8')
    expect(csv.split('\n')[0]).toContain('TDS (%),extraction yield (%),dose (g),dose gross (g),dose tare (g),beverage (g)')
    expect(csv).toContain('1.35,21.6,15,27.5,12.5,240')
    await screenshot(page, 'ledger')
  })

  it('plots it on the brewing control chart against the team\'s zone', async () => {
    await page.goto('/zone')
    const chart = onScreen(page, 'control-chart')
    await expect.poll(() => chart.locator('canvas').getAttribute('aria-label')).toMatch(/^Brewing control chart: \d+ brews against the US drip standard$/)
    await chart.locator('canvas').waitFor()
    expect(await page.getByText('1.15–1.35 %TDS · 18.0–22.0 % EY').count()).toBe(1)
    await screenshot(page, 'zone-chart')
  })

  it('measures a cupping bowl for a lot chosen in the picker, as a full immersion', async () => {
    await page.goto('/bench')
    await onScreen(page, 'change-context').click()
    await page.locator('ion-modal ion-item', { hasText: 'Lot: Copperbeck Farm' }).click()
    await expect.poll(() => onScreen(page, 'context-title').innerText()).toBe('Lot: Copperbeck Farm')
    expect(await onScreen(page, 'method').evaluate(segment => (segment as HTMLElement & { value: string }).value)).toBe('immersion')
    // SCA cupping protocol: 8.25 g per 150 mL. Full immersion by mass balance: 150 g of water at
    // 1.20 %TDS holds 150 × 0.012 / 0.988 = 1.822 g of solids, 22.1 % of 8.25 g.
    await onScreen(page, 'by-difference').click()
    await fillField(page, 'dose', '8.25')
    await fillField(page, 'water', '150')
    await addReading(page, '1.20')
    await expect.poll(() => onScreen(page, 'ey').innerText()).toBe('22.1')
    expect(await onScreen(page, 'basis').innerText()).toContain('Full immersion')
    await onScreen(page, 'save-brew').click()
    await expect.poll(() => onScreen(page, 'tds').innerText()).toBe('—')
    // The context stays for the next bowl of the same lot.
    expect(await onScreen(page, 'context-title').innerText()).toBe('Lot: Copperbeck Farm')
    await page.goto('/ledger')
    await onScreen(page, 'filter-toggle').click()
    await onScreen(page, 'filter-context').locator('ion-segment-button', { hasText: 'Lot' }).click()
    await expect.poll(() => onScreen(page, 'ledger-list').innerText()).toContain('1.20 %TDS · 22.1 % EY')
  })

  it('takes its context from a link, as the workflow screens will give it', async () => {
    await page.goto('/bench')
    await onScreen(page, 'change-context').click()
    await page.locator('ion-modal ion-item', { hasText: 'Recipe: House filter' }).click()
    await expect.poll(() => onScreen(page, 'context-title').innerText()).toBe('Recipe: House filter v2')
    // The recipe fills in its water and settings (demo data: version 2, from the night market's
    // dial-in: 250 g, 17 clicks, 3:45, 96 °C).
    expect(await onScreen(page, 'water').locator('input').inputValue()).toBe('250')
    expect(await onScreen(page, 'contact-time').locator('input').inputValue()).toBe('3:45')
    const recipeId = await page.evaluate(async () => {
      const open = indexedDB.open('lixivia')
      const db = await new Promise<IDBDatabase>(resolve => (open.onsuccess = () => resolve(open.result)))
      const all = db.transaction('recipes').objectStore('recipes').getAll()
      return new Promise<string>(resolve => (all.onsuccess = () => resolve((all.result as { id: string, name: string }[]).find(recipe => recipe.name === 'House filter')!.id)))
    })
    await page.goto('/ledger')
    await page.goto(`/bench?context=recipe&ref=${recipeId}`)
    await expect.poll(() => onScreen(page, 'context-title').innerText()).toBe('Recipe: House filter v2')
  })

  it('threw no uncaught errors', () => {
    expect(errors).toEqual([])
  })
})
