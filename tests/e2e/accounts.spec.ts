import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fillField, launchBrowser, newestMailTo, onScreen, phoneContext, screenshot, watchErrors } from './browser'

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

const stamp = Date.now().toString(36)
const founder = { name: 'Odile Farrant', email: `odile.${stamp}@saltmarsh.test`, password: 'copper kettle at dawn' }
const invitee = { name: 'Bram Ostley', email: `bram.${stamp}@saltmarsh.test`, password: 'sieve and scale 2026' }

describe('accounts and teams in the browser', () => {
  it('signs up, starts a team, invites a colleague who joins from the e-mailed link, and lists them', async () => {
    const first = await (await phoneContext(browser)).newPage()
    const firstErrors = watchErrors(first)
    await first.goto('/sign-up')
    await onScreen(first, 'submit').click()
    // Validation beside each field, before anything is sent.
    await onScreen(first, 'name').getByText('Your name must not be empty').waitFor()
    await fillField(first, 'name', founder.name)
    await fillField(first, 'email', founder.email)
    await fillField(first, 'password', founder.password)
    await onScreen(first, 'submit').click()
    await first.waitForURL(url => url.pathname === '/crew')
    await first.getByText('You are not in a team yet').waitFor()
    // The Bench leads a newcomer to a team first, at the top of the screen.
    await first.locator('#tab-button-bench').click()
    await onScreen(first, 'welcome').waitFor()
    await onScreen(first, 'welcome-crew').click()
    await first.waitForURL(url => url.pathname === '/crew')

    await onScreen(first, 'start-team').click()
    await first.locator('ion-alert input').fill('Saltmarsh Night Market')
    await first.locator('ion-alert').getByRole('button', { name: 'Create' }).click()
    await onScreen(first, 'teams').getByText('Saltmarsh Night Market').waitFor()

    await onScreen(first, 'open-members').click()
    await onScreen(first, 'member-list').getByText(founder.email).waitFor()
    await fillField(first, 'invite-email', invitee.email)
    await onScreen(first, 'invite-submit').click()
    await onScreen(first, 'invitation-list').getByText(invitee.email).waitFor()
    await screenshot(first, 'team-members-invited')

    const mail = await newestMailTo(first, invitee.email)
    expect(mail.subject).toContain('Saltmarsh Night Market')
    const link = /http:\/\/\S+\/join\?token=[\w-]{43}/.exec(mail.text)![0]

    const second = await (await phoneContext(browser)).newPage()
    const secondErrors = watchErrors(second)
    await second.goto(new URL(link).pathname + new URL(link).search)
    await second.waitForURL(url => url.pathname === '/sign-in')
    await onScreen(second, 'to-sign-up').click()
    await fillField(second, 'name', invitee.name)
    await fillField(second, 'email', invitee.email)
    await fillField(second, 'password', invitee.password)
    await onScreen(second, 'submit').click()
    await second.waitForURL(url => url.pathname === '/join')
    await onScreen(second, 'accept').click()
    await onScreen(second, 'joined').getByText('Saltmarsh Night Market').waitFor()
    await screenshot(second, 'join-accepted')

    await first.reload()
    await onScreen(first, 'member-list').getByText(invitee.email).waitFor()
    const row = onScreen(first, 'member-list').locator('ion-item', { hasText: invitee.email })
    expect(await row.innerText()).toContain('Member')
    await screenshot(first, 'team-members-joined')
    // The owner sees a control on each member: the newcomer becomes a lead.
    await row.locator('[data-test="manage-member"]').click()
    await first.locator('ion-alert button[role="radio"]', { hasText: 'lead' }).click()
    await first.locator('ion-alert button', { hasText: 'Save role' }).click()
    await expect.poll(() => row.innerText()).toMatch(/lead/i)
    expect([...firstErrors, ...secondErrors]).toEqual([])
  })

  it('says which field is wrong when signing in fails', async () => {
    const page = await (await phoneContext(browser)).newPage()
    await page.goto('/sign-in')
    await fillField(page, 'email', founder.email)
    await fillField(page, 'password', 'not my password at all')
    await onScreen(page, 'submit').click()
    await page.getByRole('alert').getByText('Wrong e-mail or password.').waitFor()
  })
})
