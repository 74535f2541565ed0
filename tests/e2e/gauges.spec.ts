import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoOwner, fillField, launchBrowser, onScreen, phoneContext, screenshot, signIn, watchErrors } from './browser'

let browser: Browser
let page: Page
let errors: string[]

beforeAll(async () => {
  browser = await launchBrowser()
  page = await (await phoneContext(browser)).newPage()
  errors = watchErrors(page)
  await signIn(page, demoOwner)
})
afterAll(async () => {
  await browser?.close()
})

describe('calibrating a refractometer on the Gauges tab', () => {
  it('adds an instrument, refusing a bad field first', async () => {
    await page.goto('/gauges')
    await onScreen(page, 'instrument-add').click()
    await onScreen(page, 'instrument-save').click()
    await onScreen(page, 'instrument-label').getByText('Give the instrument a name').waitFor()
    await fillField(page, 'instrument-label', 'Harbour gauge')
    await onScreen(page, 'instrument-kind').locator('ion-segment-button', { hasText: 'nD' }).click()
    await fillField(page, 'instrument-resolution', '0.00001')
    await fillField(page, 'instrument-repeatability', '0.00002')
    await onScreen(page, 'instrument-save').click()
    const item = onScreen(page, 'instrument-list').locator('ion-item', { hasText: 'Harbour gauge' })
    await expect.poll(() => item.innerText()).toContain('Not calibrated')
  })

  it('zeroes with water, fits four sucrose standards and makes the line active', async () => {
    await onScreen(page, 'instrument-list').locator('ion-item', { hasText: 'Harbour gauge' }).click()
    await onScreen(page, 'start-calibration').click()
    // Distilled water at 20 °C reads nD 1.33299 (ICUMSA table, row 0).
    await fillField(page, 'zero-reading', '1.33299')
    await expect.poll(() => onScreen(page, 'zero-result').innerText()).toContain('Zero check passed')
    await onScreen(page, 'sucrose-preset').click()
    // Readings of the 0, 5, 10 and 15 °Brix standards at the ICUMSA table's values.
    for (const [index, value] of ['1.33299', '1.34026', '1.34782', '1.35568'].entries())
      await fillField(page, `reading-${index}`, value)
    await expect.poll(() => onScreen(page, 'r-squared').innerText()).toMatch(/^0\.99/)
    expect(await onScreen(page, 'fit').innerText()).toContain('0.0015')
    await screenshot(page, 'gauges-calibration')
    await onScreen(page, 'accept-calibration').click()
    await expect.poll(() => onScreen(page, 'calibration-history').innerText()).toContain('Active')
    expect(await onScreen(page, 'calibration-history').innerText()).toContain('4 standards in °Brix')
  })

  it('shows the instrument as calibrated', async () => {
    await page.goto('/gauges')
    const item = onScreen(page, 'instrument-list').locator('ion-item', { hasText: 'Harbour gauge' })
    await expect.poll(() => item.innerText()).toContain('Calibrated')
    expect(errors).toEqual([])
  })
})
