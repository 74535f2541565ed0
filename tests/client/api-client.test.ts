import { afterEach, describe, expect, it, vi } from 'vitest'
import { ApiError, fetchHealth } from '../../src/api/client'

function answer(status: number, body: unknown): void {
  vi.stubGlobal('fetch', vi.fn(async () => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } })))
}

afterEach(() => {
  vi.unstubAllGlobals()
})

describe('fetchHealth', () => {
  it('parses a healthy answer', async () => {
    answer(200, { status: 'ok', db: 'up', version: '0.1.0' })
    await expect(fetchHealth()).resolves.toEqual({ status: 'ok', db: 'up', version: '0.1.0' })
    expect(fetch).toHaveBeenCalledWith('/api/v1/health', expect.objectContaining({ credentials: 'same-origin' }))
  })

  it('reads a 503 as a health body with the database down', async () => {
    answer(503, { status: 'unavailable', db: 'down', version: '0.1.0' })
    await expect(fetchHealth()).resolves.toMatchObject({ db: 'down' })
  })

  it('turns the server\'s error shape into an ApiError with its code', async () => {
    answer(500, { error: { code: 'internal', message: 'Something went wrong on the server.' } })
    await expect(fetchHealth()).rejects.toMatchObject({ name: 'ApiError', status: 500, code: 'internal' })
  })

  it('refuses an answer of the wrong shape', async () => {
    answer(200, { status: 'fine' })
    await expect(fetchHealth()).rejects.toMatchObject({ code: 'bad_response' })
  })

  it('reports no network as such', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => {
      throw new TypeError('Failed to fetch')
    }))
    const error = await fetchHealth().catch((caught: unknown) => caught)
    expect(error).toBeInstanceOf(ApiError)
    expect(error).toMatchObject({ status: 0, code: 'network' })
  })
})
