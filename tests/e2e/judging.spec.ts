import type { Browser, BrowserContext, Page } from 'playwright-core'
import { readFileSync } from 'node:fs'
import Papa from 'papaparse'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { isBlindCode } from '../../shared/records/blind-codes'
import { accessibilityProblems, fillField, launchBrowser, newestMailTo, onScreen, phoneContext, screenshot, signIn, watchErrors } from './browser'
import { measurePour, settledOn, storedRecords } from './judging-steps'

// The head judge (the demo lead) runs a heat at a brew bar whose Wi-Fi fails; a judge (the demo
// member) works on a phone of their own. Seeded accounts: server/db/seed.ts.
const lead = { email: 'tobiah@kestrel-quay.test', password: 'kestrel-demo-2026' }
const member = { email: 'mats@kestrel-quay.test', password: 'kestrel-demo-2026' }
const competitors = ['Perran Quiller', 'Elowen Sancreed', 'Jory Trevassa']
const pen = 'Heat bar pen'

let browser: Browser
let headContext: BrowserContext
let head: Page
let judgeContext: BrowserContext
let judge: Page
let errors: string[]
let codes: string[] = []
/** The competitor behind each code, as the head judge's set-up lists them (in the order of the codes). */
const competitorOf = new Map<string, string>()

async function shot(page: Page, name: string, checkAccess = true): Promise<void> {
  await screenshot(page, `judging-${name}`)
  if (checkAccess)
    expect(await accessibilityProblems(page), `serious accessibility problems on ${name}`).toEqual([])
}

beforeAll(async () => {
  browser = await launchBrowser()
  headContext = await phoneContext(browser)
  head = await headContext.newPage()
  errors = watchErrors(head)
  await signIn(head, lead)
  // One visit with signal installs the app, so it opens again in airplane mode.
  await head.goto('/field')
  await head.evaluate(async () => navigator.serviceWorker.ready)
})
afterAll(async () => {
  await browser?.close()
})

describe('a competition heat, end to end', () => {
  it('sets up an event with its zone and tolerances', async () => {
    await head.goto('/gauges')
    await onScreen(head, 'instrument-add').click()
    await fillField(head, 'instrument-label', pen)
    await onScreen(head, 'instrument-kind').locator('ion-segment-button', { hasText: '%TDS' }).click()
    await fillField(head, 'instrument-resolution', '0.01')
    await fillField(head, 'instrument-repeatability', '0.02')
    await onScreen(head, 'instrument-save').click()
    await onScreen(head, 'instrument-list').locator('ion-item', { hasText: pen }).waitFor()

    await head.locator('#tab-button-field').click()
    await onScreen(head, 'new-event').click()
    await fillField(head, 'event-name', 'Pier Head Filter Cup')
    await fillField(head, 'event-venue', 'Rope Walk Sheds')
    await fillField(head, 'event-tolerance-tds', '0.05')
    await fillField(head, 'event-tolerance-ey', '0,5')
    expect(await onScreen(head, 'event-zone').innerText()).toContain('European drip standard: 1.20–1.45 %TDS · 18.0–22.0 % EY')
    await shot(head, 'event-form')
    await onScreen(head, 'event-save').click()
    await expect.poll(() => onScreen(head, 'event-summary').innerText()).toContain('0.05 %TDS · 0.5 % EY')
    await settledOn(head, /\/field\/events\/(?!new)[^/]+$/, 'add-round')
  })

  it('adds a round of two pours per cup, two readings each, and three cups under blind codes', async () => {
    await onScreen(head, 'add-round').click()
    await fillField(head, 'round-name', 'Heat A')
    await fillField(head, 'round-readings', '2')
    await onScreen(head, 'round-judges').locator('ion-toggle', { hasText: 'Mats Quillon' }).click()
    await onScreen(head, 'round-save').click()
    await settledOn(head, /\/setup$/, 'add-cup')
    for (const name of competitors) {
      await fillField(head, 'cup-competitor', name)
      await onScreen(head, 'add-cup').click()
      await onScreen(head, 'cup-setup').getByText(name).waitFor()
    }
    for (const row of await onScreen(head, 'cup-setup').locator('[data-test="cup-setup-row"]').all())
      competitorOf.set((await row.locator('h3.code').innerText()).trim(), (await row.locator('p').innerText()).trim())
    codes = [...competitorOf.keys()]
    expect([...competitorOf.values()].sort()).toEqual([...competitors].sort())
    expect(codes).toHaveLength(3)
    expect(new Set(codes).size).toBe(3)
    expect(codes.every(isBlindCode)).toBe(true)
    await shot(head, 'round-setup')
  })

  it('prints the cup labels, codes only', async () => {
    await onScreen(head, 'print-labels').click()
    await expect.poll(() => onScreen(head, 'labels').locator('li').count()).toBe(6)
    const labels = await onScreen(head, 'labels').innerText()
    expect(labels).toContain(codes[0])
    expect(labels).not.toContain(competitors[0])
    await shot(head, 'labels')
    await head.emulateMedia({ media: 'print' })
    await head.screenshot({ path: 'tests/e2e/screenshots/judging-labels-print.png', fullPage: true })
    await head.emulateMedia({ media: 'screen' })
  })

  it('keeps the competitors off a judge\'s phone', async () => {
    judgeContext = await phoneContext(browser)
    judge = await judgeContext.newPage()
    await signIn(judge, member)
    await judge.goto('/field')
    await onScreen(judge, 'judging-section').getByText('Heat A').click()
    await onScreen(judge, `cup-${codes[0]}`).waitFor()
    const entries = await storedRecords(judge, 'entries')
    expect(entries.filter(entry => codes.includes(String(entry.code)))).toHaveLength(3)
    expect(JSON.stringify(entries)).not.toMatch(new RegExp(competitors.join('|')))
    // The demo's open heat is kept blind too: only the names of its signed-off heat are here.
    expect(entries.filter(entry => entry.contestant).length).toBe(3)
    await shot(judge, 'judge-board')
  })

  it('zero-checks the refractometer and measures the first cup on the board', async () => {
    await head.goto('/field')
    await onScreen(head, 'judging-section').getByText('Heat A').click()
    await onScreen(head, `zero-check-${pen}`).click()
    await fillField(head, 'zero-check-reading', '0.01')
    await onScreen(head, 'zero-checks').getByText('Zero check passed').waitFor()
    await onScreen(head, 'zero-check-save').click()
    await onScreen(head, `zero-${pen}`).getByText('Checked').waitFor()
    await shot(head, 'board-start')
    await measurePour(head, codes[0]!, pen, ['1.30', '1.32'])
    await measurePour(head, codes[0]!, pen, ['1.34', '1.36'])
    // Pours 1.31 and 1.35 %TDS, 15.0 g → 240.0 g: EY = 16 × TDS; mean 1.33 %TDS, 21.3 % EY.
    const card = onScreen(head, `cup-${codes[0]}`)
    await expect.poll(() => card.innerText()).toContain('2 of 2 pours · 4 of 4 readings')
    expect(await card.locator('[data-test="cup-means"]').innerText()).toBe('1.33 %TDS (spread 0.04) · 21.3 % EY (spread 0.6)')
  })

  it('measures the other cups with the venue\'s network gone, through a reload', async () => {
    await headContext.setOffline(true)
    await head.reload()
    await onScreen(head, 'round-board').waitFor()
    await shot(head, 'board-offline-reloaded')
    await measurePour(head, codes[1]!, pen, ['1.25', '1.27'])
    await measurePour(head, codes[1]!, pen, ['1.29', '1.27'])
    await measurePour(head, codes[2]!, pen, ['1.55', '1.57'])
    await measurePour(head, codes[2]!, pen, ['1.55', '1.57'])
    // 1.56 %TDS and 25.0 % EY: 0.11 above the zone's 1.45, and 3.0 above its 22.0.
    await expect.poll(() => onScreen(head, `cup-${codes[2]}`).locator('[data-test="cup-flag"]').innerText()).toBe('Strength 0.11 %TDS above the zone, 0.06 past the 0.05 allowed; extraction 3.0 % EY above the zone, 2.5 past the 0.5 allowed.')
    // Both of the last cup's pours read the same, so its flag shows after the first; the count waits for the second.
    await expect.poll(() => onScreen(head, 'board-count').innerText()).toBe('Cups: 3 of 3 measured')
    await shot(head, 'board-offline-measured')
  })

  it('a judge measures a pour offline that reaches the server only after the sign-off', async () => {
    await judge.evaluate(async () => navigator.serviceWorker.ready)
    await judgeContext.setOffline(true)
    await measurePour(judge, codes[1]!, pen, ['1.28', '1.28'])
  })

  it('sends everything when signal returns, then signs the round off after the check list', async () => {
    await headContext.setOffline(false)
    await onScreen(head, 'to-sign-off').click()
    await onScreen(head, 'checklist').waitFor()
    await expect.poll(() => onScreen(head, 'check-measured').innerText()).toContain('Done')
    expect(await onScreen(head, 'check-flagged').innerText()).toContain('Open')
    await onScreen(head, `seen-${codes[2]}`).locator('ion-toggle').click()
    await expect.poll(() => onScreen(head, 'check-flagged').innerText()).toContain('Done')
    await expect.poll(() => onScreen(head, 'check-zero').innerText()).toContain('Done')
    await shot(head, 'sign-off-checklist')
    await onScreen(head, 'sign-off').click()
    await head.locator('ion-alert button', { hasText: /^Sign off$/ }).click()
    await expect.poll(() => onScreen(head, 'signed-off').innerText(), { timeout: 20_000 }).toContain('Signed off by Tobiah Lenk')
    await shot(head, 'board-signed-off')
  })

  it('refuses the judge\'s late pour with a reason the judge can read on the board', async () => {
    await judgeContext.setOffline(false)
    await expect.poll(() => onScreen(judge, 'round-problems').innerText(), { timeout: 30_000 }).toContain('This round is signed off')
    await shot(judge, 'judge-refused')
    // With the sign-off the names reach the judge's phone.
    await expect.poll(async () => (await storedRecords(judge, 'entries')).filter(entry => competitors.includes(String(entry.contestant))).length, { timeout: 30_000 }).toBe(3)
  })

  it('shows the results sheet, prints it, and downloads every reading as CSV', async () => {
    await onScreen(head, 'round-results').click()
    const table = onScreen(head, 'results-table')
    await expect.poll(() => table.innerText()).toContain(competitors[2])
    expect(await onScreen(head, `result-${codes[0]}`).innerText()).toContain('1.33 · 21.3')
    await shot(head, 'results')
    await head.emulateMedia({ media: 'print' })
    await head.screenshot({ path: 'tests/e2e/screenshots/judging-results-print.png', fullPage: true })
    const pdf = await head.pdf({ format: 'A4' })
    expect(pdf.subarray(0, 4).toString()).toBe('%PDF')
    await head.emulateMedia({ media: 'screen' })

    const [download] = await Promise.all([head.waitForEvent('download'), onScreen(head, 'results-csv').click()])
    const { data } = Papa.parse<Record<string, string>>(readFileSync((await download.path())!, 'utf8'), { header: true, skipEmptyLines: true })
    expect(data).toHaveLength(12)
    expect(data[0]).toMatchObject({ code: codes[0], competitor: competitorOf.get(codes[0]), pour: '1', reading: '1', tds_percent: '1.30', extraction_percent: '20.8', instrument: pen })
    expect(data.filter(row => row.flag).map(row => row.code)).toEqual(Array.from({ length: 4 }, () => codes[2]))
  })

  it('e-mails the results to the organisers with the CSV attached', async () => {
    await fillField(head, 'results-email-to', 'desk@pier-head.test')
    await onScreen(head, 'results-email-send').click()
    await expect.poll(() => onScreen(head, 'results-email-sent').innerText()).toContain('Sent to desk@pier-head.test')
    const mail = await newestMailTo(head, 'desk@pier-head.test')
    expect(mail.subject).toBe('Results: Pier Head Filter Cup · Heat A')
    expect(mail.attachments?.map(file => file.filename)).toEqual(['pier-head-filter-cup-heat-a-results.csv'])
    expect(Buffer.from(mail.attachments![0]!.content, 'base64').toString('utf8')).toContain(competitors[1])
    await shot(head, 'results-sent')
  })

  it('shows the round side by side on the control chart, each cup by its code', async () => {
    await head.goto(head.url().replace(/\/results$/, '/chart'))
    const label = await onScreen(head, 'control-chart').locator('canvas').getAttribute('aria-label')
    for (const code of codes)
      expect(label).toContain(code)
    await shot(head, 'chart')
  })

  it('threw no uncaught errors', () => {
    expect(errors).toEqual([])
  })
})
