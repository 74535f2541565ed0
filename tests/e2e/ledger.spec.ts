import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { accessibilityProblems, addReading, fillField, launchBrowser, onScreen, phoneContext, screenshot, signIn, waitForTitle, watchErrors } from './browser'

// Seeded demo accounts (server/db/seed.ts). Mats recorded the "Too coarse" pour-over of the demo data.
const member = { email: 'mats@kestrel-quay.test', password: 'kestrel-demo-2026' }
const lead = { email: 'tobiah@kestrel-quay.test', password: 'kestrel-demo-2026' }

let browser: Browser
let page: Page
let errors: string[]

beforeAll(async () => {
  browser = await launchBrowser()
  page = await (await phoneContext(browser)).newPage()
  errors = watchErrors(page)
  await signIn(page, member)
})
afterAll(async () => {
  await browser?.close()
})

async function openBrew(p: Page, words: string): Promise<void> {
  await p.goto('/ledger')
  await fillField(p, 'filter-search', words)
  const list = onScreen(p, 'ledger-list')
  await expect.poll(() => list.locator('ion-item').count(), { timeout: 15_000 }).toBe(1)
  await list.locator('ion-item').first().click()
  await waitForTitle(p, 'Brew')
}

describe('editing a brew from the log', () => {
  it('corrects the dose and adds a reading; the history keeps what it was', async () => {
    await openBrew(page, 'burr change')
    // The demo brew: 1.11 %TDS, 236 g from 15 g → 17.5 % (EY = TDS × beverage / dose).
    await expect.poll(() => onScreen(page, 'detail-ey').innerText()).toBe('17.5')
    await onScreen(page, 'edit-brew').click()
    await waitForTitle(page, 'Edit the brew')
    await fillField(page, 'dose', '14.5')
    await addReading(page, '1.13')
    // Mean of 1.12, 1.10, 1.11, 1.13 = 1.115 %TDS; × 236 / 14.5 = 18.1 %.
    await expect.poll(() => onScreen(page, 'ey').innerText()).toBe('18.1')
    await screenshot(page, 'brew-edit')
    expect(await accessibilityProblems(page)).toEqual([])
    await onScreen(page, 'save-edit').click()
    await waitForTitle(page, 'Brew')
    await expect.poll(() => onScreen(page, 'detail-ey').innerText()).toBe('18.1')
    const history = onScreen(page, 'brew-history')
    await expect.poll(() => history.innerText(), { timeout: 15_000 }).toContain('Dose (g): 15.0 → 14.5')
    expect(await history.innerText()).toContain('Readings: 3 → 4')
    expect(await history.innerText()).toMatch(/Result: 1\.11 %TDS, 17\.5 % → 1\.12 %TDS, 18\.1 %/)
    await history.scrollIntoViewIfNeeded()
    await screenshot(page, 'brew-history')
  })

  it('lets a lead correct a teammate\'s brew only with a reason, which stays on record', async () => {
    const other = await (await phoneContext(browser)).newPage()
    await signIn(other, lead)
    await openBrew(other, 'burr change')
    await onScreen(other, 'edit-brew').click()
    await waitForTitle(other, 'Edit the brew')
    await fillField(other, 'notes', 'Too coarse after the burr change; burrs reseated')
    await onScreen(other, 'save-edit').click()
    await onScreen(other, 'edit-reason').getByText('Say why you correct a teammate').waitFor()
    await fillField(other, 'edit-reason', 'Added the service note from the log book')
    await onScreen(other, 'save-edit').click()
    await waitForTitle(other, 'Brew')
    await expect.poll(() => onScreen(other, 'brew-history').innerText(), { timeout: 15_000 }).toContain('Reason: Added the service note from the log book')
    await other.close()
  })
})

describe('deleting a brew', () => {
  it('can be undone at once, and otherwise takes the brew out of the log', async () => {
    await openBrew(page, 'burr change')
    await onScreen(page, 'delete-brew').click()
    await waitForTitle(page, 'Ledger')
    const undo = page.locator('ion-toast').getByRole('button', { name: 'Undo' })
    await undo.click()
    const list = onScreen(page, 'ledger-list')
    await fillField(page, 'filter-search', 'burr change')
    await expect.poll(() => list.locator('ion-item').count()).toBe(1)

    await list.locator('ion-item').first().click()
    await waitForTitle(page, 'Brew')
    await onScreen(page, 'delete-brew').click()
    await waitForTitle(page, 'Ledger')
    await fillField(page, 'filter-search', 'burr change')
    await expect.poll(() => list.locator('ion-item').count()).toBe(0)
    await page.locator('ion-toast').waitFor({ state: 'detached', timeout: 10_000 })
    await page.reload()
    await fillField(page, 'filter-search', 'burr change')
    await page.getByText('No brew matches these filters.').waitFor()
  })
})

describe('a team zone', () => {
  it('is refused with an impossible range, then saved, chosen and drawn', async () => {
    await page.goto('/zone')
    await onScreen(page, 'zone-add').click()
    await fillField(page, 'zone-name', 'Harbour house filter')
    await fillField(page, 'zone-tds-min', '1.40')
    await fillField(page, 'zone-tds-max', '1.25')
    await fillField(page, 'zone-ey-min', '19')
    await fillField(page, 'zone-ey-max', '21.5')
    await onScreen(page, 'zone-save').click()
    await onScreen(page, 'zone-tds-max').getByText('The upper strength limit must be above the lower one.').waitFor()
    await fillField(page, 'zone-tds-min', '1.25')
    await fillField(page, 'zone-tds-max', '1.40')
    await onScreen(page, 'zone-save').click()
    await expect.poll(() => page.locator('.ion-page:not(.ion-page-hidden) .legend').first().innerText()).toContain('Harbour house filter: 1.25–1.40 %TDS · 19.0–21.5 % EY (Team zone)')
    expect(await onScreen(page, 'team-zones').innerText()).toContain('Harbour house filter')
    await screenshot(page, 'zone-team')
    expect(await accessibilityProblems(page)).toEqual([])
  })

  it('threw no uncaught errors', () => {
    expect(errors).toEqual([])
  })
})
