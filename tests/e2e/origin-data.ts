import type { Page } from 'playwright-core'
import { expect } from 'vitest'
import { accessibilityProblems, screenshot, waitForTitle } from './browser'

// The trip day of tests/e2e/origin.spec.ts: who, what the seller offers, what the bowls read.

// A member of the seeded demo team (server/db/seed.ts) spends a day at origin with no signal.
export const member = { email: 'mats@kestrel-quay.test', password: 'kestrel-demo-2026' }
export const trip = 'Saltmarsh Hills sample run'

// Full immersion with no beverage weighed: EY = W × TDS / ((1 − TDS) × dose), TDS as a fraction
// (DESIGN.md, the immersion mass balance). 8.25 g in 150 g of water, the SCA cupping ratio.
const immersionEy = (tdsPercent: number): number => 100 * 150 * (tdsPercent / 100) / ((1 - tdsPercent / 100) * 8.25)
const mean = (values: number[]): number => values.reduce((sum, v) => sum + v, 0) / values.length
export const bowls = { 'Fernhollow Terraces': ['1.12', '1,13', '1.11'], 'Quillmoor Cooperative': ['1.20', '1.21', '1.20'], 'Brackenfold Growers': ['1.05', '1.06', '1.05', '1.19'] }
export const fernhollowTds = mean([1.12, 1.13, 1.11])
export const fernhollowEy = mean([1.12, 1.13, 1.11].map(immersionEy))

/** The lot form as a buyer fills it at the farm; the moisture with a decimal comma. */
export const fernhollowFields: [string, string][] = [['farm', 'Fernhollow Terraces'], ['reference', 'FT-07'], ['region', 'Saltmarsh Hills'], ['altitudeMinM', '1650'], ['altitudeMaxM', '1800'], ['variety', 'Typica'], ['process', 'washed'], ['harvest', '2025/26 main crop'], ['bags', '20'], ['bagKg', '69'], ['moisturePercent', '10,9'], ['waterActivity', '0.55'], ['densityGPerL', '735'], ['screenSize', '16/18'], ['primaryDefects', '0'], ['secondaryDefects', '4'], ['askingPrice', '7.10'], ['currency', 'eur']]
/** One taster's score sheet for Fernhollow, a body score typed with a decimal comma. */
export const fernhollowMarks: Record<string, string> = { 'fragrance-aroma': '7.75', 'flavour': '8', 'aftertaste': '7.75', 'acidity': '8', 'body': '7,75', 'balance': '7.75', 'uniformity': '10', 'clean-cup': '10', 'sweetness': '10', 'overall': '8' }

// An invented seller's sheet: one new lot, one whose price uses a decimal comma in a point sheet,
// and Fernhollow again (already on the trip).
export const offerCsv = [
  'Lot,Producer,Region,Altitude (masl),Variety,Process,Bags,Moisture %,Density g/L,Price (EUR/kg)',
  'BG-02,Brackenfold Growers,Saltmarsh Hills,"1,500-1,650",Bourbon,natural,15 x 60 kg,11.2,702,6.40',
  'QX-9,Tidewrack Farm,Saltmarsh Hills,1400,Catuai,washed,10,10.6,690,"3,85"',
  'FT-07,Fernhollow Terraces,Saltmarsh Hills,1700,Typica,washed,20,10.9,735,7.10',
].join('\r\n')

/** A data-test element on the screen Ionic shows, once no other screen is leaving. */
export const visibleOn = (page: Page, name: string) => page.locator(`.ion-page:not(.ion-page-hidden) [data-test="${name}"]`).filter({ visible: true })

/** Back one screen, once the screen before has finished leaving. */
export async function backTo(page: Page, title: string): Promise<void> {
  const button = page.locator('ion-back-button').filter({ visible: true })
  await expect.poll(() => button.count()).toBe(1)
  await button.click()
  await waitForTitle(page, title)
}

/** A screenshot of the step, and no serious or critical accessibility problem on it. */
export async function shotOf(page: Page, name: string, access: boolean): Promise<void> {
  await screenshot(page, `origin-${name}`)
  if (access)
    expect(await accessibilityProblems(page), `serious accessibility problems on ${name}`).toEqual([])
}

/** The team server as the member's own session reads it: every change of the team, and its photos. */
export async function teamServer(page: Page, account: { email: string, password: string }) {
  const login = await (await page.request.post('/api/v1/auth/login', { data: account })).json() as { accessToken: string }
  const headers = { Authorization: `Bearer ${login.accessToken}` }
  const me = await (await page.request.get('/api/v1/me', { headers })).json() as { memberships: { teamId: string }[] }
  const teamId = me.memberships[0]!.teamId
  const pulled = await (await page.request.get(`/api/v1/sync/pull?teamId=${teamId}&since=0&limit=1000`, { headers })).json() as { changes: { entity: string, data: Record<string, unknown> }[] }
  return {
    changes: pulled.changes,
    async photo(id: string) {
      const response = await page.request.get(`/api/v1/teams/${teamId}/photos/${id}`, { headers })
      return { status: response.status(), type: response.headers()['content-type'], bytes: await response.body() }
    },
  }
}
