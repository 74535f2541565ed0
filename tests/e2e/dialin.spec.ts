import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { accessibilityProblems, addReading, fillField, launchBrowser, onScreen, phoneContext, screenshot, signIn, watchErrors } from './browser'

// Seeded demo accounts (server/db/seed.ts): the lead dials in at a fair with no signal; a member's
// phone is the second phone of the crew.
const lead = { email: 'tobiah@kestrel-quay.test', password: 'kestrel-demo-2026' }
const member = { email: 'mats@kestrel-quay.test', password: 'kestrel-demo-2026' }
const place = 'Brackwater Lantern Fair, stall 3'
const recipeName = 'Lantern Fair filter'

// Four attempts on 15.0 g with the Bar pen's %TDS readings; EY = TDS × beverage / dose (mass
// balance), worked by hand: 1.10 × 231 / 15 = 16.9; 1.16 × 230 / 15 = 17.8; 1.27 × 229 / 15 = 19.4;
// 1.33 × 228 / 15 = 20.2 % (the European drip zone is 1.20–1.45 %TDS and 18–22 %).
const attempts = [
  { change: '', grind: '26 clicks', beverage: '231', tds: '1.10', expected: { tds: '1.10', ey: '16.9' } },
  { change: 'Two clicks finer', grind: '24 clicks', beverage: '230', tds: '1.16', expected: { tds: '1.16', ey: '17.8' } },
  { change: 'Two more clicks finer', grind: '22 clicks', beverage: '229', tds: '1.27', expected: { tds: '1.27', ey: '19.4' } },
  { change: 'One more click finer', grind: '21 clicks', beverage: '228', tds: '1.33', expected: { tds: '1.33', ey: '20.2' } },
]

let browser: Browser
let context: BrowserContext
let page: Page
let errors: string[]
let sessionPath = ''

async function shot(name: string, checkAccess = true): Promise<void> {
  await screenshot(page, `dialin-${name}`)
  if (checkAccess)
    expect(await accessibilityProblems(page), `serious accessibility problems on ${name}`).toEqual([])
}

beforeAll(async () => {
  browser = await launchBrowser()
  context = await phoneContext(browser)
  page = await context.newPage()
  errors = watchErrors(page)
  await signIn(page, lead)
  // One visit with signal installs the app and syncs the crew's records; then the fair has none.
  await page.goto('/field')
  await page.evaluate(async () => navigator.serviceWorker.ready)
  await page.reload()
  await onScreen(page, 'house-recipes').getByText('House filter').waitFor({ timeout: 20_000 })
  await context.setOffline(true)
})
afterAll(async () => {
  await browser?.close()
})

describe('dialling in at an event, offline', () => {
  it('shows the crew\'s house recipe and the night market\'s dial-in on the Field tab', async () => {
    expect(await onScreen(page, 'house-recipes').innerText()).toContain('House filter v2')
    expect(await onScreen(page, 'dial-in-sessions').innerText()).toContain('Gullstone Night Market, stall 7')
    await shot('field')
  })

  it('opens the demo session: five numbered attempts on the chart and in the table', async () => {
    await onScreen(page, 'dial-in-sessions').locator('ion-item', { hasText: 'Gullstone' }).click()
    await expect.poll(() => onScreen(page, 'attempt-table').locator('tbody tr').count()).toBe(5)
    await expect.poll(() => onScreen(page, 'dial-in-chart').locator('canvas').getAttribute('aria-label')).toContain('5 attempts in the order brewed')
    expect(await onScreen(page, 'adopted-5').innerText()).toBe('Adopted as version 2')
    await shot('demo-session')
    await page.locator('.ion-page:not(.ion-page-hidden) ion-back-button').click()
  })

  it('starts a blank dial-in with its place, grinder and water', async () => {
    await onScreen(page, 'start-dial-in').click()
    await onScreen(page, 'dial-in-recipe').locator('ion-radio', { hasText: 'A blank start' }).click()
    await onScreen(page, 'dial-in-start').locator('ion-radio', { hasText: 'European drip standard' }).click()
    await fillField(page, 'dial-in-place', place)
    await fillField(page, 'dial-in-grinder', 'Conical burr grinder, borrowed')
    await fillField(page, 'dial-in-water', 'Fair standpipe, jug filter')
    await shot('start')
    await onScreen(page, 'dial-in-begin').click()
    await onScreen(page, 'dial-in-header').getByText(place).waitFor()
    sessionPath = new URL(page.url()).pathname
    expect(await onScreen(page, 'dial-in-target').innerText()).toContain('European drip standard (the dial-in\'s zone)')
  })

  for (const [index, attempt] of attempts.entries()) {
    const number = index + 1
    it(`measures attempt ${number} and sees where it lands`, async () => {
      await onScreen(page, 'measure-attempt').click()
      await onScreen(page, 'attempt-context').waitFor()
      if (number === 1) {
        // Net masses on a brew scale, readings from the Bar pen in %TDS.
        await onScreen(page, 'by-difference').click()
        await onScreen(page, 'instrument').locator('ion-segment-button', { hasText: /^Bar pen$/ }).click()
      }
      if (attempt.change)
        await fillField(page, 'change-note', attempt.change)
      await fillField(page, 'grind', attempt.grind)
      await fillField(page, 'dose', '15')
      await fillField(page, 'beverage', attempt.beverage)
      await addReading(page, attempt.tds)
      await expect.poll(() => onScreen(page, 'ey').innerText()).toBe(attempt.expected.ey)
      expect(await onScreen(page, 'tds').innerText()).toBe(attempt.expected.tds)
      expect(await onScreen(page, 'ratio').innerText()).toMatch(/^Brew ratio 1:\d+\.\d \(grams of beverage per gram of coffee\)$/)
      if (number === 2)
        await shot('attempt')
      await onScreen(page, 'save-attempt').click()
      await expect.poll(() => onScreen(page, 'attempt-table').locator('tbody tr').count()).toBe(number)
      expect(await onScreen(page, `attempt-${number}`).innerText()).toContain(`${attempt.expected.tds} %TDS`)
      if (number === 2) {
        // Under-extracted and weak: extraction first, with a size, and the strength from the solver.
        const next = onScreen(page, 'dial-in-next')
        await expect.poll(() => next.innerText()).toContain('Next, after attempt 2')
        expect(await next.innerText()).toMatch(/Raise the extraction 2\.2 points: grind finer/)
        expect(await next.innerText()).toContain('For 1.33 %TDS at 17.8 % EY: pour')
        await next.scrollIntoViewIfNeeded()
        await shot('next')
      }
    })
  }

  it('joins the four attempts on the chart, first to last, against the session\'s zone', async () => {
    const label = () => onScreen(page, 'dial-in-chart').locator('canvas').getAttribute('aria-label')
    await expect.poll(label).toContain('4 attempts in the order brewed, 1 at 1.10 %TDS and 16.9 %, 2 at 1.16 %TDS and 17.8 %, 3 at 1.27 %TDS and 19.4 %, 4 at 1.33 %TDS and 20.2 %, against the European drip standard')
    await onScreen(page, 'dial-in-chart').scrollIntoViewIfNeeded()
    await shot('chart')
    await onScreen(page, 'attempt-table').scrollIntoViewIfNeeded()
    expect(await onScreen(page, 'attempt-3').innerText()).toContain('Two more clicks finer')
    await shot('table')
  })

  it('adopts the third attempt as a new recipe, still offline', async () => {
    await onScreen(page, 'adopt-3').click()
    const alert = page.locator('ion-alert')
    // Blank fields take the defaults their placeholders name; the name is typed here.
    await alert.locator('input').first().fill(recipeName)
    await shot('adopt', false)
    await alert.getByRole('button', { name: 'Adopt' }).click()
    await expect.poll(() => onScreen(page, 'adopted-3').innerText()).toBe('Adopted as version 1')
    expect(await onScreen(page, 'dial-in-recipe-link').innerText()).toContain(`${recipeName} v1`)
  })

  it('makes it the crew\'s house recipe for percolation', async () => {
    await onScreen(page, 'make-house').click()
    await expect.poll(() => onScreen(page, 'dial-in-house').innerText()).toContain(`“${recipeName}” is the crew's house recipe for percolation.`)
    await shot('house')
  })

  it('keeps the adopted numbers as the recipe, with its version, and scales it to a batch', async () => {
    await onScreen(page, 'dial-in-recipe-link').click()
    const summary = onScreen(page, 'recipe-summary')
    await expect.poll(() => summary.innerText()).toContain('House recipe for percolation')
    // Attempt 3: 15.0 g → 229.0 g, water 229 + 2.0 × 15 = 259.0 g (LRR common practice), 22 clicks.
    expect(await summary.innerText()).toContain('15.0 g in 259.0 g of water (229.0 g of beverage)')
    expect(await summary.innerText()).toContain('22 clicks')
    expect(await onScreen(page, 'recipe-versions').innerText()).toContain(`Attempt 3 of the dial-in at ${place}`)
    // Ten 229 g cups: 2290 g / (229 / 15) = 150.0 g of coffee in 2290 + 2.0 × 150 = 2590.0 g of water.
    await shot('recipe')
    await fillField(page, 'batch-cups', '10')
    await expect.poll(() => onScreen(page, 'batch-result').innerText()).toContain('150.0 g of coffee in 2590.0 g of water for 2290.0 g of beverage')
    await onScreen(page, 'batch-scaler').scrollIntoViewIfNeeded()
    await shot('batch')
  })

  it('copies the recipe, changes the copy with a reason and retires it, all offline', async () => {
    await onScreen(page, 'recipe-copy').click()
    await expect.poll(() => onScreen(page, 'recipe-name').locator('input').inputValue()).toBe(`${recipeName} (copy)`)
    await fillField(page, 'recipe-name', 'Lantern Fair iced base')
    await onScreen(page, 'recipe-save').click()
    await expect.poll(() => onScreen(page, 'recipe-summary').innerText()).toContain('Lantern Fair iced base · version 1')
    expect(await onScreen(page, 'recipe-versions').innerText()).toContain(`Copied from “${recipeName}” version 1`)
    await onScreen(page, 'recipe-edit').click()
    await fillField(page, 'recipe-grind', '20 clicks')
    await onScreen(page, 'recipe-save').click()
    // A change needs its reason, named beside the field.
    await onScreen(page, 'recipe-reason').getByText('Say why you change it').waitFor()
    await fillField(page, 'recipe-reason', 'Finer for a stronger base over ice')
    await onScreen(page, 'recipe-form').scrollIntoViewIfNeeded()
    await shot('edit')
    await onScreen(page, 'recipe-save').click()
    await expect.poll(() => onScreen(page, 'recipe-summary').innerText()).toContain('Lantern Fair iced base · version 2')
    expect(await onScreen(page, 'recipe-versions').innerText()).toContain('grind 22 clicks → 20 clicks')
    await onScreen(page, 'recipe-retire').click()
    const alert = page.locator('ion-alert')
    await alert.locator('input').fill('Only for the summer fair')
    await alert.getByRole('button', { name: 'Retire' }).click()
    await expect.poll(() => onScreen(page, 'recipe-summary').innerText()).toContain('Retired')
    expect(await onScreen(page, 'recipe-versions').innerText()).toContain('Version 3 · current')
  })

  it('sends it all when signal returns', async () => {
    await context.setOffline(false)
    const versions = onScreen(page, 'recipe-versions')
    await expect.poll(() => versions.innerText(), { timeout: 30_000 }).toContain('Synced')
    expect(await versions.innerText()).not.toContain('Waiting to sync')
  })

  it('threw no uncaught errors', () => {
    expect(errors).toEqual([])
  })
})

describe('the same house recipe on a second phone', () => {
  let second: BrowserContext
  let other: Page
  beforeAll(async () => {
    second = await phoneContext(browser)
    other = await second.newPage()
    await signIn(other, member)
  })
  afterAll(async () => {
    await second?.close()
  })

  it('shows the new house recipe on the Field tab after its sync', async () => {
    await other.goto('/field')
    await expect.poll(() => onScreen(other, 'house-recipes').innerText(), { timeout: 30_000 }).toContain(`${recipeName} v1`)
    expect(await onScreen(other, 'house-recipes').innerText()).not.toContain('House filter')
    await expect.poll(() => onScreen(other, 'dial-in-sessions').innerText()).toMatch(new RegExp(`${place}\\s+${recipeName} · 4 attempts`))
    await screenshot(other, 'dialin-second-phone-field')
  })

  it('offers it first on the Bench', async () => {
    await other.locator('#tab-button-bench').click()
    await onScreen(other, 'change-context').click()
    const first = other.locator('[data-test="context-choices"] ion-item').first()
    await expect.poll(() => first.innerText()).toMatch(new RegExp(`^House recipe for percolation\\s+Recipe: ${recipeName} v1\\s`))
    await screenshot(other, 'dialin-second-phone-picker')
    await first.click()
    await expect.poll(() => onScreen(other, 'context-title').innerText()).toBe(`Recipe: ${recipeName} v1`)
  })

  it('never uses the recipe\'s hidden water once the Bench switches to espresso: 18 g → 36 g is 1:2.0', async () => {
    // The house recipe filled in 259 g of water; an espresso hides the field and must not use it
    // (it once gave 259 / 18 = 1:14.4). EY = 10.00 × 36 / 18 = 20.0 % (handbook worked espresso).
    expect(await onScreen(other, 'water').locator('input').inputValue()).toBe('259')
    await onScreen(other, 'method').locator('ion-segment-button', { hasText: 'Espresso' }).click()
    await onScreen(other, 'by-difference').click()
    await fillField(other, 'dose', '18')
    await fillField(other, 'beverage', '36')
    await addReading(other, '10')
    await expect.poll(() => onScreen(other, 'ratio').innerText()).toBe('Brew ratio 1:2.0 (grams of beverage per gram of coffee)')
    expect(await onScreen(other, 'ey').innerText()).toBe('20.0')
    await onScreen(other, 'result').scrollIntoViewIfNeeded()
    await screenshot(other, 'dialin-second-phone-espresso-ratio')
  })

  it('shows the session it came from, with its four attempts', async () => {
    await other.goto(sessionPath)
    await expect.poll(() => onScreen(other, 'attempt-table').locator('tbody tr').count(), { timeout: 20_000 }).toBe(4)
  })
})
