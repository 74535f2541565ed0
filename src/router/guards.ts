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
    // The outbox and sync engine load with the first signed-in screen, not in the entry chunk.
    void import('../stores/sync').then(({ useSyncStore }) => useSyncStore().start())
    return true
  })
}
