// A year of one team's brews for `npm run bench:phone`, pushed through the real sync API so the
// server stores and derives them as it would a phone's: brews spread over the last 365 days, each
// with its readings, a few refractometers and a team zone. Invented data, the same on every run.
import { v7 as uuidv7 } from 'uuid'
import { maxMutationsPerPush } from '../../shared/schemas/sync'

export interface SeedOptions {
  origin: string
  brews: number
  readingsPerBrew: number
  account: { email: string, password: string, name: string }
}

export interface Seeded { token: string, teamId: string, mutations: number, seconds: number }

type Json = Record<string, any>

async function call(origin: string, route: string, body: unknown, token?: string): Promise<Json> {
  const response = await fetch(`${origin}/api/v1${route}`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', ...(token ? { Authorization: `Bearer ${token}` } : {}) },
    body: JSON.stringify(body),
  })
  if (!response.ok)
    throw new Error(`POST ${route}: ${response.status} ${await response.text()}`)
  return response.json() as Promise<Json>
}

/** A small seeded generator (Park–Miller), so every run seeds the same brews. */
function generator(seed = 11): () => number {
  let state = seed
  return () => {
    state = (state * 16807) % 2147483647
    return state / 2147483647
  }
}

const methods = ['percolation', 'percolation', 'percolation', 'immersion'] as const
const grinds = ['18', '19', '20', '21', '22', '7.5', '8']
const notes = ['', '', '', 'bright, a little thin', 'heavy body, long finish', 'sweet, balanced', 'dry finish', 'fruit forward']

export async function seedTeam(options: SeedOptions): Promise<Seeded> {
  const { origin, account } = options
  const { accessToken: token } = await call(origin, '/auth/register', account)
  const teamId = (await call(origin, '/teams', { name: 'Bench year crew' }, token)).team.id as string
  const random = generator()
  const put = (entity: string, data: Json, id = uuidv7()) => ({ mutationId: uuidv7(), entity, op: 'put', id, teamId, baseRev: null, data })

  const queue: Json[] = [
    put('instrument', { label: 'Bar refractometer', readingKind: 'tds', resolution: 0.01, repeatability: 0.02 }),
    put('instrument', { label: 'Cupping lab refractometer', readingKind: 'brix', resolution: 0.1, repeatability: 0.1 }),
    put('instrument', { label: 'Travel refractometer', readingKind: 'tds', resolution: 0.01, repeatability: 0.03 }),
    put('zone', { name: 'House filter', tdsPercent: { min: 1.3, max: 1.45 }, yieldPercent: { min: 19, max: 22 } }),
  ]
  const now = Date.now()
  const yearMs = 365 * 24 * 60 * 60 * 1000
  for (let i = 0; i < options.brews; i++) {
    // Oldest first, as a crew would have recorded them, a few minutes apart at random.
    const brewedAt = new Date(now - yearMs + (i / options.brews) * yearMs + random() * 600_000).toISOString()
    const method = methods[Math.floor(random() * methods.length)]!
    const dose = Math.round((15 + random() * 7) * 10) / 10
    const beverageMass = Math.round(dose * (14.5 + random() * 3.5) * 10) / 10
    const tds = 1.15 + random() * 0.4
    const brewId = uuidv7()
    queue.push(put('brew', {
      context: { kind: 'quick', refId: null },
      method,
      strengthSource: 'direct',
      dose,
      beverageMass,
      grindSetting: grinds[Math.floor(random() * grinds.length)]!,
      notes: notes[Math.floor(random() * notes.length)]!,
      brewedAt,
    }, brewId))
    for (let r = 0; r < options.readingsPerBrew; r++)
      queue.push(put('reading', { brewId, value: Math.round((tds + (random() - 0.5) * 0.04) * 100) / 100, kind: 'tds', takenAt: brewedAt }))
  }

  const clientId = uuidv7()
  const started = performance.now()
  for (let i = 0; i < queue.length; i += maxMutationsPerPush) {
    const { results } = await call(origin, '/sync/push', { clientId, mutations: queue.slice(i, i + maxMutationsPerPush) }, token)
    const refused = (results as { status: string }[]).find(result => result.status !== 'applied')
    if (refused)
      throw new Error(`seed not applied: ${JSON.stringify(refused)}`)
    if ((i / maxMutationsPerPush) % 50 === 0)
      process.stdout.write(`\rseeding ${Math.min(i + maxMutationsPerPush, queue.length)} of ${queue.length} mutations`)
  }
  process.stdout.write('\n')
  return { token, teamId, mutations: queue.length, seconds: (performance.now() - started) / 1000 }
}
