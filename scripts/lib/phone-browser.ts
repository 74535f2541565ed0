// The phone half of `npm run bench:phone`: Debian's Chromium at 390 × 844 on the built app, timing
// what a person waits for. Every figure is wall time from the tap (or the navigation) until the
// screen shows what makes it usable; CDP gives the heap and the CPU throttling.
import type { Browser, BrowserContext, Page } from 'playwright-core'
import os from 'node:os'
import path from 'node:path'
import { chromium } from 'playwright-core'

interface SyncFigures {
  firstSyncSeconds: number
  /** A tab tapped while the first sync runs, until it shows (null when the sync ended first). */
  tapDuringSyncMs: number | null
  progressSeen: string | null
}

/** How long a screen may take before the run notes it as not within the limit and goes on. */
const slow = Number(process.env.BENCH_TIMEOUT_MS ?? 90_000)
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
async function firstSync(page: Page, account: { email: string, password: string }, brews: number): Promise<SyncFigures> {
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

/** A figure as it is measured, printed at once (a run that stalls later still shows what it got). */
export type Emit = (name: string, value: number | string | null, unit: string, target: number | string) => void

/** Times an action; a wait past the limit gives null ("not within the limit") instead of stopping the run. */
async function within(action: () => Promise<unknown>): Promise<number | null> {
  try {
    return await time(action)
  }
  catch (error) {
    if (error instanceof Error && error.name === 'TimeoutError')
      return null
    throw error
  }
}

export async function measurePhone(browser: Browser, baseURL: string, account: { email: string, password: string }, brews: number, emit: Emit): Promise<void> {
  const context = await phone(browser, baseURL)
  const page = await context.newPage()
  const sync = await firstSync(page, account, brews)
  emit('first sync of a new phone', Number(sync.firstSyncSeconds.toFixed(1)), 's', 15)
  emit('progress shown during it', sync.progressSeen ?? 'none', '', '"n of m"')
  emit('a tab tapped during it (Crew)', sync.tapDuringSyncMs ?? 'sync ended first', 'ms', 1000)
  await page.evaluate(async () => navigator.serviceWorker.ready)

  // A fresh start of the app on a tab with little on it, then each tab as a person taps it.
  await page.goto('/field')
  await visible(page, tabReady.field!).waitFor()
  const tab = async (name: string) => emit(`${name[0]!.toUpperCase()}${name.slice(1)} tab usable after a tap`, await within(() => tapTab(page, name)), 'ms', 1000)
  for (const name of ['bench', 'zone', 'ledger']) {
    await tab(name)
    // A picture of each, to look at what a year of brews looks like there.
    await page.waitForTimeout(300)
    await page.screenshot({ path: path.join(os.tmpdir(), `lixivia-bench-${name}.png`) })
  }
  const detail = await within(async () => {
    await visible(page, tabReady.ledger!).click()
    await onScreen(page, 'edit-brew').waitFor()
  })
  emit('a brew\'s detail from the Ledger', detail, 'ms', 1000)
  if (detail !== null) {
    await page.locator('.ion-page:not(.ion-page-hidden) ion-back-button').click()
    await visible(page, tabReady.ledger!).waitFor()
    emit('longest task scrolling the Ledger', await scrollLedger(page), 'ms', 200)
  }
  for (const name of ['gauges', 'crew'])
    await tab(name)

  const cdp = await context.newCDPSession(page)
  await cdp.send('HeapProfiler.enable')
  await cdp.send('HeapProfiler.collectGarbage')
  const { usedSize } = await cdp.send('Runtime.getHeapUsage')
  emit('JS heap after GC, every tab visited', Math.round(usedSize / 1024 / 1024), 'MB', 150)

  // Offline, a slow phone (4× CPU throttling), the app opened again from its service worker.
  await context.setOffline(true)
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 })
  emit('offline warm start to Bench, 4× CPU', await within(async () => {
    await page.goto('/bench', { waitUntil: 'commit' })
    await visible(page, tabReady.bench!).waitFor()
    await onScreen(page, 'save-brew').waitFor()
  }), 'ms', 1500)
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 })
  await context.close()
}
