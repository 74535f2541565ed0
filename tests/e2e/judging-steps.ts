import type { Page } from 'playwright-core'
import { expect } from 'vitest'
import { addReading, fillField, onScreen } from './browser'

// Steps of the judging flow a spec repeats: a pour measured from the round board, and what a
// phone's IndexedDB holds.

/** Taps a cup's "measure" button on the board, measures one pour on the Bench and goes back to the board. */
export async function measurePour(page: Page, code: string, instrument: string, readings: [string, string]): Promise<void> {
  await onScreen(page, `measure-${code}`).click()
  await expect.poll(() => onScreen(page, 'context-title').innerText()).toContain(`Cup ${code}`)
  const chosen = onScreen(page, 'instrument').locator('ion-segment-button', { hasText: instrument })
  if (!(await chosen.evaluate(element => element.classList.contains('segment-button-checked'))))
    await chosen.click()
  // 15.0 g of coffee and 240.0 g of beverage, weighed as gross and tare.
  await fillField(page, 'dose-gross', '27.5')
  await fillField(page, 'dose-tare', '12.5')
  await fillField(page, 'beverage-gross', '652.6')
  await fillField(page, 'beverage-tare', '412.6')
  for (const value of readings)
    await addReading(page, value)
  await expect.poll(() => onScreen(page, 'tds').innerText()).not.toBe('—')
  await onScreen(page, 'save-brew').click()
  await expect.poll(() => onScreen(page, 'tds').innerText()).toBe('—')
  await onScreen(page, 'context-link').click()
  await onScreen(page, 'round-board').waitFor()
}

/** Every record of one table of the app's IndexedDB on this page, read without the app. */
export async function storedRecords(page: Page, table: string): Promise<Record<string, unknown>[]> {
  return page.evaluate(async name => new Promise<Record<string, unknown>[]>((resolve, reject) => {
    const open = indexedDB.open('lixivia')
    open.onerror = () => reject(open.error)
    open.onsuccess = () => {
      const request = open.result.transaction(name, 'readonly').objectStore(name).getAll()
      request.onsuccess = () => {
        resolve(request.result as Record<string, unknown>[])
        open.result.close()
      }
      request.onerror = () => reject(request.error)
    }
  }), table)
}

/**
 * Waits until a saved form's page has replaced the blank one: the address is the record's, and one
 * element of the name shows, steadily, for half a second (Ionic keeps the leaving page in view
 * while it slides away).
 */
export async function settledOn(page: Page, address: RegExp, name: string): Promise<void> {
  await page.waitForURL(address)
  let steady = 0
  for (let waited = 0; steady < 10 && waited < 10_000; waited += 50) {
    steady = (await onScreen(page, name).count()) === 1 ? steady + 1 : 0
    await page.waitForTimeout(50)
  }
  expect(steady).toBe(10)
}
