import type { Express } from 'express'
import type { SyncTransport } from '../../src/sync/engine'
import type { Account } from '../server/auth-helpers'
import request from 'supertest'
import { expect } from 'vitest'
import { LixiviaDatabase } from '../../src/db/database'
import { createSyncEngine } from '../../src/sync/engine'
import { bearer } from '../server/auth-helpers'

/** How a delivery goes wrong: never sent, sent but the answer lost (as when the server restarts after its commit), or sent twice. */
export type Fault = 'none' | 'drop-request' | 'drop-response' | 'duplicate'

class NoNetwork extends Error {
  readonly status = 0
}

/** A phone: its own IndexedDB, its own engine, a transport to the real app that can be told to fail once. */
export function phone(app: Express, account: Account, teamId: string, name: string) {
  const local = new LixiviaDatabase(name)
  let fault: Fault = 'none'
  const transport: SyncTransport = {
    async push(body) {
      const current = fault
      fault = 'none'
      if (current === 'drop-request')
        throw new NoNetwork('request lost')
      const send = () => request(app).post('/api/v1/sync/push').set(...bearer(account)).send(body)
      let response = await send()
      if (current === 'duplicate')
        response = await send()
      if (current === 'drop-response')
        throw new NoNetwork('answer lost after the server committed')
      expect(response.status, JSON.stringify(response.body)).toBe(200)
      return response.body
    },
    async pull(team, since, limit) {
      const response = await request(app).get('/api/v1/sync/pull').query({ teamId: team, since, limit }).set(...bearer(account))
      expect(response.status).toBe(200)
      return response.body
    },
  }
  const engine = createSyncEngine({ database: local, transport, teamIds: () => [teamId], schedule: () => {}, pullLimit: 7, batchSize: 3 })
  return { account, local, engine, failNext: (next: Fault) => (fault = next) }
}

export type Phone = ReturnType<typeof phone>
