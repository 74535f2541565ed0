import type { Role } from '../../shared/schemas/auth'
import { IonButton, IonicVue } from '@ionic/vue'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import { frozenMessage } from '../../shared/records/rules'
import { db } from '../../src/db/database'
import { useSessionStore } from '../../src/stores/session'
import RoundBoardPage from '../../src/views/RoundBoardPage.vue'
import { localRecord } from './records'

// The round board on a phone's own store: a heat judged against the European drip zone
// (1.20–1.45 %TDS, 18–22 % EY) allowing 0.05 %TDS and 0.5 % EY, two pours of two readings per cup.
const team = 't'
const at = '2026-05-01T08:30:00.000Z'
const event = localRecord('event', { id: 'e1', name: 'Gull Point Open', zoneId: 'european-drip', toleranceTdsPercent: 0.05, toleranceYieldPercent: 0.5 })
const round = localRecord('round', { id: 'r1', eventId: 'e1', name: 'Heat 1', position: 1, poursPerCup: 2, readingsPerPour: 2, judgeIds: [], zoneId: null, toleranceTdsPercent: null, toleranceYieldPercent: null })
const cups = [localRecord('entry', { id: 'c1', roundId: 'r1', code: 'KX4M', contestant: '', notes: '' }), localRecord('entry', { id: 'c2', roundId: 'r1', code: 'T9PH', contestant: '', notes: '' })]
const pen = localRecord('instrument', { id: 'i1', label: 'Bar pen', readingKind: 'tds', resolution: 0.01, repeatability: 0.02, brixFactor: null, notes: '' })

/** A pour of 15.0 g → 240.0 g (EY = 16 × TDS), read on the pen. */
async function pour(id: string, cup: string, values: number[]): Promise<void> {
  await db.brews.put(localRecord('brew', { id, context: { kind: 'entry', refId: cup }, method: 'percolation', strengthSource: 'direct', instrumentId: 'i1', calibrationId: null, dose: 15, beverageMass: 240, brewedAt: at, excludedReadingIds: [] }))
  await db.readings.bulkPut(values.map((value, i) => localRecord('reading', { id: `${id}-${i}`, brewId: id, value, kind: 'tds', instrumentId: 'i1', calibrationId: null, takenAt: at })))
}

/** Where an Ionic button leads (its router-link), found by its data-test name. */
const linkOf = (wrapper: Awaited<ReturnType<typeof mountBoard>>, name: string): unknown => wrapper.findAllComponents(IonButton).find(button => button.attributes('data-test') === name)?.props('routerLink')

async function mountBoard(role: Role) {
  const router = createRouter({ history: createMemoryHistory(), routes: ['/field/rounds/:id', '/bench', '/field/events/:id', '/ledger/:id', '/crew/attention', '/field/rounds/:id/:screen'].map(path => ({ path, component: { template: '<div />' } })) })
  await router.push('/field/rounds/r1')
  await router.isReady()
  const pinia = createPinia()
  setActivePinia(pinia)
  const session = useSessionStore()
  session.user = { id: 'me', name: 'Tobiah Lenk', email: 'tobiah@kestrel-quay.test' }
  session.memberships = [{ teamId: team, teamName: 'Crew', role }]
  session.activeTeamId = team
  // The header's back button needs Ionic's router outlet, which a test does not mount.
  const wrapper = mount(RoundBoardPage, { global: { plugins: [IonicVue, pinia, router], stubs: { ShellBackHeader: true } } })
  await vi.waitFor(() => expect(wrapper.find('[data-test="cup-KX4M"]').exists()).toBe(true))
  await flushPromises()
  return wrapper
}

beforeEach(async () => {
  // The members list is fetched with signal; here there is none, and the copy on the phone is empty.
  vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('offline'))))
  await db.events.put(event)
  await db.rounds.put(round)
  await db.entries.bulkPut(cups)
  await db.instruments.put(pen)
  await pour('b1', 'c1', [1.3, 1.32])
  await pour('b2', 'c1', [1.34, 1.36])
  await pour('b3', 'c2', [1.55, 1.57])
})
afterEach(async () => {
  vi.unstubAllGlobals()
  await Promise.all(db.recordTables.map(table => table.clear()))
  await db.outbox.clear()
})

describe('RoundBoardPage', () => {
  it('shows every cup with its pours, readings, mean and spread, and flags the one past the tolerance', async () => {
    const wrapper = await mountBoard('member')
    const done = wrapper.find('[data-test="cup-KX4M"]')
    expect(done.find('[data-test="cup-counts"]').text()).toBe('2 of 2 pours · 4 of 4 readings')
    // Pours 1.31 and 1.35: mean 1.33 %TDS, 21.28 → 21.3 % EY; spreads 0.04 and 0.64 → 0.6.
    expect(done.find('[data-test="cup-means"]').text()).toBe('1.33 %TDS (spread 0.04) · 21.3 % EY (spread 0.6)')
    expect(done.find('[data-test="cup-flag"]').exists()).toBe(false)
    const flagged = wrapper.find('[data-test="cup-T9PH"]')
    // 1.56 %TDS is 0.11 above 1.45; 24.96 → 25.0 % EY is 3.0 above 22.
    expect(flagged.find('[data-test="cup-flag"]').text()).toBe('Strength 0.11 %TDS above the zone, 0.06 past the 0.05 allowed; extraction 3.0 % EY above the zone, 2.5 past the 0.5 allowed.')
    expect(flagged.find('[data-test="cup-counts"]').text()).toBe('1 of 2 pours · 2 of 4 readings')
    expect(wrapper.find('[data-test="board-count"]').text()).toBe('Cups: 1 of 2 measured')
    expect(wrapper.find('[data-test="hot-water-caution"]').text()).toContain('close to boiling')
  })

  it('warns about cups read on an instrument without a zero check that day, until one is recorded', async () => {
    const wrapper = await mountBoard('member')
    expect(wrapper.findAll('[data-test="cup-zero-warning"]').map(w => w.text())).toEqual(['Read on Bar pen without a zero check that day.', 'Read on Bar pen without a zero check that day.'])
    // 10:00 at +02:00 is 08:00 UTC, the readings' day where the check was made.
    await db.zeroChecks.put(localRecord('zeroCheck', { id: 'z1', instrumentId: 'i1', kind: 'tds', reading: 0.01, checkedAt: '2026-05-01T10:00:00.000+02:00', notes: '' }))
    await vi.waitFor(() => expect(wrapper.findAll('[data-test="cup-zero-warning"]')).toHaveLength(0))
  })

  it('sends a tap on a cup to the Bench with the cup as the context', async () => {
    const wrapper = await mountBoard('member')
    expect(linkOf(wrapper, 'measure-T9PH')).toBe('/bench?context=entry&ref=c2')
    expect(wrapper.find('[data-test="measure-T9PH"]').text()).toBe('Measure pour 2')
  })

  it('offers set-up and sign-off to the head judge only', async () => {
    expect((await mountBoard('member')).find('[data-test="to-sign-off"]').exists()).toBe(false)
    const lead = await mountBoard('lead')
    expect(lead.find('[data-test="to-sign-off"]').exists()).toBe(true)
    expect(lead.find('[data-test="round-setup"]').exists()).toBe(true)
  })

  it('shows the reason a change to a cup was refused after the round was signed off', async () => {
    await db.brews.update('b3', { sync: { state: 'rejected', baseRev: null, reason: frozenMessage } })
    await db.outbox.add({ mutationId: 'm1', entity: 'brew', op: 'put', id: 'b3', teamId: team, baseRev: null, createdAt: at, sentAt: null, rejected: { mutationId: 'm1', status: 'rejected', reason: frozenMessage } })
    const wrapper = await mountBoard('member')
    const problems = wrapper.find('[data-test="round-problems"]')
    expect(problems.text()).toContain(`Brew: Percolation brew of 2026-05-01: ${frozenMessage}`)
    expect(linkOf(wrapper, 'to-attention')).toBe('/crew/attention')
  })
})
