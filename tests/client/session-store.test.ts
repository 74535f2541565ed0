import { createPinia, setActivePinia } from 'pinia'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { hasAccessToken, setAccessToken } from '../../src/api/client'
import { db } from '../../src/db/database'
import { useSessionStore } from '../../src/stores/session'

const user = { id: '0190a8c4-0000-7000-8000-000000000001', email: 'mats@kestrel-quay.test', name: 'Mats Quillon' }
const memberships = [{ teamId: '0190a8c4-0000-7000-8000-0000000000aa', teamName: 'Kestrel Quay Tasting Crew', role: 'member' as const }]

/** A fake server: answers by path, or throws like fetch does with no network. */
function server(routes: Record<string, [number, unknown] | 'offline'>): void {
  vi.stubGlobal('fetch', vi.fn(async (url: string) => {
    const answer = routes[url.replace('/api/v1', '')]
    if (!answer || answer === 'offline')
      throw new TypeError('Failed to fetch')
    return new Response(JSON.stringify(answer[1]), { status: answer[0], headers: { 'Content-Type': 'application/json' } })
  }))
}

const cacheIdentity = () => db.identity.put({ key: 'current', user, memberships, activeTeamId: memberships[0]!.teamId, cachedAt: '2026-11-30T08:00:00.000Z' })

beforeEach(async () => {
  setActivePinia(createPinia())
  setAccessToken(null)
  await db.identity.clear()
})
afterEach(() => {
  vi.unstubAllGlobals()
})

describe('useSessionStore().ready', () => {
  it('keeps working offline under the identity cached on the phone', async () => {
    await cacheIdentity()
    server({ '/auth/refresh': 'offline' })
    const session = useSessionStore()
    await session.ready()
    expect(session.status).toBe('offline')
    expect(session.user).toEqual(user)
    expect(session.role).toBe('member')
  })

  it('keeps the identity but asks to sign in again when the session has ended', async () => {
    await cacheIdentity()
    server({ '/auth/refresh': [401, { error: { code: 'unauthenticated', message: 'Your session has ended. Sign in again.' } }] })
    const session = useSessionStore()
    await session.ready()
    expect(session.status).toBe('expired')
    expect(session.user?.email).toBe(user.email)
  })

  it('is signed out with nothing cached, without asking the server', async () => {
    server({ '/auth/refresh': [401, { error: { code: 'unauthenticated', message: 'Sign in.' } }] })
    const session = useSessionStore()
    await session.ready()
    expect(session.status).toBe('signed-out')
    expect(session.user).toBeNull()
    expect(fetch).not.toHaveBeenCalled()
  })

  it('stays with the cached identity without a request when the phone has no signal', async () => {
    await cacheIdentity()
    server({ '/auth/refresh': [200, { user, accessToken: 'header.payload.signature' }] })
    vi.stubGlobal('navigator', { ...navigator, onLine: false })
    const session = useSessionStore()
    await session.ready()
    expect(session.status).toBe('offline')
    expect(fetch).not.toHaveBeenCalled()
  })

  it('renews the session online and caches the profile, never the tokens', async () => {
    await cacheIdentity()
    server({
      '/auth/refresh': [200, { user, accessToken: 'header.payload.signature' }],
      '/me': [200, { user, memberships }],
    })
    const session = useSessionStore()
    await session.ready()
    expect(session.status).toBe('signed-in')
    expect(hasAccessToken()).toBe(true)
    const cached = await db.identity.get('current')
    expect(cached?.memberships).toEqual(memberships)
    expect(JSON.stringify(cached)).not.toContain('header.payload.signature')
  })
})

describe('useSessionStore().signOut', () => {
  it('forgets the identity on the phone', async () => {
    await cacheIdentity()
    server({ '/auth/refresh': 'offline', '/auth/logout': 'offline' })
    const session = useSessionStore()
    await session.ready()
    await session.signOut()
    expect(session.status).toBe('signed-out')
    expect(await db.identity.get('current')).toBeUndefined()
  })
})
