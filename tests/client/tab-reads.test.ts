import type { DBCoreTable } from 'dexie'
import type { Component } from 'vue'
import { IonicVue } from '@ionic/vue'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import { db } from '../../src/db/database'
import { useSessionStore } from '../../src/stores/session'
import BenchPage from '../../src/views/BenchPage.vue'
import CrewPage from '../../src/views/CrewPage.vue'
import FieldPage from '../../src/views/FieldPage.vue'
import GaugesPage from '../../src/views/GaugesPage.vue'
import LedgerPage from '../../src/views/LedgerPage.vue'
import ZonePage from '../../src/views/ZonePage.vue'
import { localRecord } from './records'

// A guard against a screen that loads a whole table to show itself: every brew and reading the
// phone's store hands out is counted (a Dexie middleware under every query), and each tab is
// mounted on a team of 2,500 brews with two readings each, past the chart's limit for single dots.
const read = { brews: 0, readings: 0 }
const counted = (name: string): name is keyof typeof read => name === 'brews' || name === 'readings'
db.use({
  stack: 'dbcore',
  name: 'count-rows-read',
  create: down => ({
    ...down,
    table(name: string): DBCoreTable {
      const table = down.table(name)
      if (!counted(name))
        return table
      return {
        ...table,
        get: async (req) => {
          const row = await table.get(req)
          read[name] += row ? 1 : 0
          return row
        },
        getMany: async (req) => {
          const rows = await table.getMany(req)
          read[name] += rows.filter(Boolean).length
          return rows
        },
        query: async (req) => {
          const result = await table.query(req)
          if (req.values)
            read[name] += result.result.length
          return result
        },
        openCursor: async (req) => {
          const cursor = await table.openCursor(req)
          if (!cursor || !req.values)
            return cursor
          // Each step of a cursor over values hands out one row.
          return Object.create(cursor, {
            start: { value: (onNext: () => void) => cursor.start(() => {
              read[name] += 1
              onNext()
            }) },
          })
        },
      }
    },
  }),
})

const team = 't'
const brews = 2500
beforeAll(async () => {
  vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('offline'))))
  const start = Date.parse('2026-01-01T07:00:00.000Z')
  await db.brews.bulkPut(Array.from({ length: brews }, (_, i) => localRecord('brew', {
    id: `b${String(i).padStart(5, '0')}`,
    context: { kind: 'quick', refId: null },
    method: i % 4 ? 'percolation' : 'immersion',
    strengthSource: 'direct',
    dose: 15,
    beverageMass: 240,
    brewedAt: new Date(start + i * 3_600_000).toISOString(),
    derived: { tdsPercent: 1.2 + (i % 30) / 100, yieldPercent: 19 + (i % 40) / 10 },
  })))
  await db.readings.bulkPut(Array.from({ length: brews * 2 }, (_, i) => localRecord('reading', { id: `r${i}`, brewId: `b${String(i >> 1).padStart(5, '0')}`, value: 1.3, kind: 'tds', takenAt: '2026-06-01T08:00:00.000Z' })))
  await db.instruments.put(localRecord('instrument', { id: 'i1', label: 'Bar pen', readingKind: 'tds', resolution: 0.01, repeatability: 0.02, brixFactor: null, notes: '' }))
})
afterAll(async () => {
  vi.unstubAllGlobals()
  await Promise.all(db.recordTables.map(table => table.clear()))
})

async function mountTab(page: Component) {
  const router = createRouter({ history: createMemoryHistory(), routes: ['/', '/:rest(.*)'].map(path => ({ path, component: { template: '<div />' } })) })
  await router.push('/')
  await router.isReady()
  const pinia = createPinia()
  setActivePinia(pinia)
  const session = useSessionStore()
  session.user = { id: 'me', name: 'Tobiah Lenk', email: 'tobiah@kestrel-quay.test' }
  session.memberships = [{ teamId: team, teamName: 'Crew', role: 'member' }]
  session.activeTeamId = team
  return mount(page, { global: { plugins: [IonicVue, pinia, router] } })
}

describe('each tab on a team of 2,500 brews', () => {
  it.each([
    ['Bench', BenchPage],
    ['Field', FieldPage],
    ['Zone', ZonePage],
    ['Ledger', LedgerPage],
    ['Gauges', GaugesPage],
    ['Crew', CrewPage],
  ] as const)('%s reads a bounded number of brews and no readings to show itself', async (_name, page) => {
    read.brews = 0
    read.readings = 0
    const wrapper = await mountTab(page)
    // Long enough for every live query of the screen to have answered (and the chart's points).
    await new Promise(resolve => setTimeout(resolve, 1500))
    await flushPromises()
    expect(read.brews).toBeLessThanOrEqual(200)
    expect(read.readings).toBe(0)
    wrapper.unmount()
  })

  it('would notice a screen that reads the whole table', async () => {
    read.brews = 0
    await db.brews.where('teamId').equals(team).toArray()
    expect(read.brews).toBe(brews)
  })
})
