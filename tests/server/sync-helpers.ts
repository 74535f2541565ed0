import type { Express } from 'express'
import type { Account } from './auth-helpers'
import request from 'supertest'
import { v7 as uuidv7 } from 'uuid'
import { bearer } from './auth-helpers'

export const now = (): string => new Date().toISOString()

/** A mutation as a phone's outbox sends it. */
export function put(entity: string, teamId: string, data: Record<string, unknown>, options: { id?: string, baseRev?: number | null, reason?: string } = {}) {
  return { mutationId: uuidv7(), entity, op: 'put' as const, id: options.id ?? uuidv7(), teamId, data, baseRev: options.baseRev ?? null, ...(options.reason ? { reason: options.reason } : {}) }
}

export function remove(entity: string, teamId: string, id: string, baseRev: number | null, reason?: string) {
  return { mutationId: uuidv7(), entity, op: 'delete' as const, id, teamId, baseRev, ...(reason ? { reason } : {}) }
}

export function restore(entity: string, teamId: string, id: string, baseRev: number | null, reason?: string) {
  return { mutationId: uuidv7(), entity, op: 'restore' as const, id, teamId, baseRev, ...(reason ? { reason } : {}) }
}

export const instrument = (label = 'Bar refractometer') => ({ label, readingKind: 'tds', resolution: 0.01, repeatability: 0.02 })

/** A pour-over whose readings are already %TDS. */
export function pourOver(extra: Record<string, unknown> = {}) {
  return {
    context: { kind: 'quick', refId: null },
    method: 'percolation',
    strengthSource: 'direct',
    dose: 15,
    beverageGross: 652.6,
    beverageTare: 412.6,
    brewedAt: now(),
    ...extra,
  }
}

export const reading = (brewId: string, value: number) => ({ brewId, value, kind: 'tds', takenAt: now() })

export async function push(app: Express, account: Account, mutations: unknown[], clientId = uuidv7()) {
  return request(app).post('/api/v1/sync/push').set(...bearer(account)).send({ clientId, mutations })
}

export async function pull(app: Express, account: Account, teamId: string, since = 0, limit?: number) {
  return request(app).get('/api/v1/sync/pull').query({ teamId, since, ...(limit ? { limit } : {}) }).set(...bearer(account))
}
