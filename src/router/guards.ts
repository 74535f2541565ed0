import type { Router } from 'vue-router'

declare module 'vue-router' {
  interface RouteMeta {
    /** Open without an identity: sign-in, sign-up, password screens. */
    guest?: boolean
  }
}

/**
 * Every screen but the guest ones needs an identity: a live session, or one cached on this phone
 * (offline, or a session that has ended but whose entries must stay usable). The session store is
 * loaded on demand so IndexedDB code stays out of the entry chunk.
 */
export function installGuards(router: Router): void {
  router.beforeEach(async (to) => {
    const { useSessionStore } = await import('../stores/session')
    const session = useSessionStore()
    await session.ready()
    if (to.meta.guest) {
      if (session.status === 'signed-in' && (to.name === 'sign-in' || to.name === 'sign-up'))
        return typeof to.query.redirect === 'string' ? to.query.redirect : { name: 'bench' }
      return true
    }
    if (!session.user)
      return { name: 'sign-in', query: { redirect: to.fullPath } }
    // The outbox and sync engine load once the first signed-in screen has shown (when the phone is
    // idle, within 2 s), not in the entry chunk and not in the way of that screen's own reads.
    const startSync = () => void import('../stores/sync').then(({ useSyncStore }) => useSyncStore().start())
    if (typeof requestIdleCallback === 'function')
      requestIdleCallback(startSync, { timeout: 2000 })
    else
      setTimeout(startSync, 0)
    return true
  })
}
