// The phone half of `npm run bench:phone`: Debian's Chromium at 390 × 844 on the built app, timing
// what a person waits for. Every figure is wall time from the tap (or the navigation) until the
// screen shows what makes it usable; CDP gives the heap and the CPU throttling.
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { chromium } from 'playwright-core'

export interface PhoneFigures {
  firstSyncSeconds: number
  /** A tab tapped while the first sync runs, until it shows (null when the sync ended first). */
  tapDuringSyncMs: number | null
  progressSeen: string | null
  tabMs: Record<string, number>
  brewDetailMs: number
  longestScrollTaskMs: number
  heapMb: number
  offlineBenchMs: number
}

const slow = Number(process.env.BENCH_TIMEOUT_MS ?? 240_000)
const visible = (page: Page, selector: string) => page.locator(selector).filter({ visible: true }).first()
const onScreen = (page: Page, name: string) => visible(page, `[data-test="${name}"]`)

/** What makes each tab usable: the element a person reaches for first. */
const tabReady: Record<string, string> = {
  bench: '[data-test="recent-brews"] ion-item',
  zone: '[data-test="control-chart"] canvas',
  ledger: '[data-test="ledger-list"] ion-item',
  gauges: '[data-test="instrument-list"] ion-item',
  crew: '[data-test="sync-state"]',
  field: '.ion-page:not(.ion-page-hidden) ion-title:has-text("Field")',
}

export async function launch(chromiumPath: string): Promise<Browser> {
  return chromium.launch({
    executablePath: chromiumPath,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--enable-precise-memory-info'],
  })
}

export async function phone(browser: Browser, baseURL: string): Promise<BrowserContext> {
  const context = await browser.newContext({ baseURL, viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, hasTouch: true, isMobile: true })
  context.setDefaultTimeout(slow)
  // tsx names the functions given to page.evaluate with a helper the page lacks: one that does nothing.
  await context.addInitScript('window.__name = fn => fn')
  return context
}

/** The phone's own count of a table and its sync mark, read with IndexedDB itself (no app code). */
async function phoneState(page: Page): Promise<{ brews: number, synced: boolean }> {
  return page.evaluate(() => new Promise((resolve) => {
    const open = indexedDB.open('lixivia')
    open.onerror = () => resolve({ brews: 0, synced: false })
    open.onsuccess = () => {
      const idb = open.result
      if (!idb.objectStoreNames.contains('brews') || !idb.objectStoreNames.contains('meta')) {
        idb.close()
        return resolve({ brews: 0, synced: false })
      }
      const tx = idb.transaction(['brews', 'meta'], 'readonly')
      const count = tx.objectStore('brews').count()
      const mark = tx.objectStore('meta').get('lastSyncedAt')
      tx.oncomplete = () => {
        idb.close()
        resolve({ brews: count.result, synced: Boolean(mark.result) })
      }
    }
  }))
}

async function time(action: () => Promise<unknown>): Promise<number> {
  const started = performance.now()
  await action()
  return Math.round(performance.now() - started)
}

async function tapTab(page: Page, tab: string): Promise<number> {
  return time(async () => {
    await page.locator(`#tab-button-${tab}`).click()
    await visible(page, tabReady[tab]!).waitFor()
  })
}

/** Signs in on a new phone and waits for the first sync to bring every brew. */
async function firstSync(page: Page, account: { email: string, password: string }, brews: number): Promise<Pick<PhoneFigures, 'firstSyncSeconds' | 'tapDuringSyncMs' | 'progressSeen'>> {
  await page.goto('/sign-in')
  await onScreen(page, 'email').locator('input').fill(account.email)
  await onScreen(page, 'password').locator('input').fill(account.password)
  const started = performance.now()
  await onScreen(page, 'submit').click()
  await page.waitForURL(url => !url.pathname.startsWith('/sign-in'))
  let tapDuringSyncMs: number | null = null
  let progressSeen: string | null = null
  for (;;) {
    const state = await phoneState(page)
    if (state.synced && state.brews >= brews)
      break
    if (tapDuringSyncMs === null && performance.now() - started > 2000 && state.brews < brews) {
      tapDuringSyncMs = await tapTab(page, 'crew')
      const progress = page.locator('[data-test="sync-progress"]').filter({ visible: true })
      progressSeen = (await progress.count()) ? (await progress.first().textContent())?.trim() ?? null : null
    }
    await page.waitForTimeout(250)
  }
  return { firstSyncSeconds: (performance.now() - started) / 1000, tapDuringSyncMs, progressSeen }
}

/** The longest main-thread task while the Ledger scrolls through a few hundred rows, in ms. */
async function scrollLedger(page: Page): Promise<number> {
  return page.evaluate(async () => {
    let longest = 0
    const observer = new PerformanceObserver((list) => {
      for (const entry of list.getEntries())
        longest = Math.max(longest, entry.duration)
    })
    observer.observe({ type: 'longtask' })
    const content = Array.from(document.querySelectorAll('ion-content')).find(el => el.closest('.ion-page:not(.ion-page-hidden)') && el.querySelector('[data-test="ledger-list"]')) as (HTMLElement & { getScrollElement: () => Promise<HTMLElement> }) | undefined
    const scroller = content ? await content.getScrollElement() : document.scrollingElement!
    const frame = () => new Promise(resolve => requestAnimationFrame(resolve))
    for (let step = 0; step < 120; step++) {
      scroller.scrollBy(0, step < 100 ? 450 : -1800)
      await frame()
      await frame()
    }
    // A jump far down the list, as a thumb flick to a month ago would.
    scroller.scrollTop = scroller.scrollHeight / 2
    await new Promise(resolve => setTimeout(resolve, 600))
    observer.disconnect()
    return Math.round(longest)
  })
}

export async function measurePhone(browser: Browser, baseURL: string, account: { email: string, password: string }, brews: number): Promise<PhoneFigures> {
  const context = await phone(browser, baseURL)
  const page = await context.newPage()
  const sync = await firstSync(page, account, brews)
  await page.evaluate(async () => navigator.serviceWorker.ready)

  // A fresh start of the app on a tab with little on it, then each tab as a person taps it.
  await page.goto('/field')
  await visible(page, tabReady.field!).waitFor()
  const tabMs: Record<string, number> = {}
  for (const tab of ['bench', 'zone', 'ledger'])
    tabMs[tab] = await tapTab(page, tab)
  const brewDetailMs = await time(async () => {
    await visible(page, tabReady.ledger!).click()
    await onScreen(page, 'edit-brew').waitFor()
  })
  await page.locator('.ion-page:not(.ion-page-hidden) ion-back-button').click()
  await visible(page, tabReady.ledger!).waitFor()
  const longestScrollTaskMs = await scrollLedger(page)
  for (const tab of ['gauges', 'crew'])
    tabMs[tab] = await tapTab(page, tab)

  const cdp = await context.newCDPSession(page)
  await cdp.send('HeapProfiler.enable')
  await cdp.send('HeapProfiler.collectGarbage')
  const { usedSize } = await cdp.send('Runtime.getHeapUsage')

  // Offline, a slow phone (4× CPU throttling), the app opened again from its service worker.
  await context.setOffline(true)
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 })
  const offlineBenchMs = await time(async () => {
    await page.goto('/bench', { waitUntil: 'commit' })
    await visible(page, tabReady.bench!).waitFor()
    await onScreen(page, 'save-brew').waitFor()
  })
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 })
  await context.close()
  return { ...sync, tabMs, brewDetailMs, longestScrollTaskMs, heapMb: usedSize / 1024 / 1024, offlineBenchMs }
}
