import type { Actor } from '../../shared/records/rules'
import type { Membership, Role, User } from '../../shared/schemas/auth'
import { defineStore } from 'pinia'
import { computed, ref, toRaw } from 'vue'
import { ApiError } from '../api/errors'
import { readCachedIdentity } from '../db/identity'

// The database, the API client and the record rules load when first needed: a phone nobody is
// signed in on shows the sign-in screen without Dexie or zod (npm run size).
const database = async () => (await import('../db/database')).db
const accounts = () => import('../api/accounts')
const client = () => import('../api/client')

/**
 * starting: not known yet. signed-in: the server knows us. offline: no signal, working under the
 * identity cached on this phone. expired: the session cannot be renewed; sign in again (nothing on
 * the phone is lost). signed-out: nobody.
 */
export type SessionStatus = 'starting' | 'signed-in' | 'offline' | 'expired' | 'signed-out'

/**
 * What the server sends depends on who reads it and in which role (a cup's competitor is sealed
 * for members and viewers until sign-off): when the person or the role on a team changes, the
 * team is pulled again from the start, so the records on the phone are what this reader may hold.
 */
async function pullAgainIfReaderChanged(userId: string, memberships: Membership[]): Promise<void> {
  const db = await database()
  for (const membership of memberships) {
    const key = `pulledAs:${membership.teamId}`
    const reader = `${userId}:${membership.role}`
    if ((await db.meta.get(key))?.value === reader)
      continue
    await db.meta.delete(`cursor:${membership.teamId}`)
    await db.meta.put({ key, value: reader })
    const { can } = await import('../../shared/records/rules')
    if (!can.seeCompetitors(membership.role, false))
      await forgetCompetitors(membership.teamId)
  }
}

/** Blanks the competitors of cups in rounds not signed off, kept here from an earlier reader. */
async function forgetCompetitors(teamId: string): Promise<void> {
  const db = await database()
  await db.transaction('rw', db.entries, db.rounds, async () => {
    const open = new Set((await db.rounds.where('teamId').equals(teamId).toArray()).filter(round => !round.derived).map(round => round.id))
    await db.entries.where('teamId').equals(teamId).filter(entry => open.has(entry.roundId) && entry.contestant !== '').modify({ contestant: '' })
  })
}

export const useSessionStore = defineStore('session', () => {
  const status = ref<SessionStatus>('starting')
  const user = ref<User | null>(null)
  const memberships = ref<Membership[]>([])
  const activeTeamId = ref<string | null>(null)

  const activeMembership = computed(() => memberships.value.find(m => m.teamId === activeTeamId.value) ?? null)
  const role = computed<Role | null>(() => activeMembership.value?.role ?? null)
  const canManageTeam = computed(() => role.value === 'owner' || role.value === 'lead')
  /** Who holds the phone in the active team, as the record rules (shared/records/rules.ts) take it. */
  const actor = computed<Actor | null>(() => (user.value && role.value ? { userId: user.value.id, role: role.value } : null))

  async function remember(next: { user: User, memberships: Membership[] }): Promise<void> {
    user.value = next.user
    memberships.value = next.memberships
    if (!next.memberships.some(m => m.teamId === activeTeamId.value))
      activeTeamId.value = next.memberships[0]?.teamId ?? null
    await pullAgainIfReaderChanged(next.user.id, next.memberships)
    // IndexedDB cannot store Vue proxies: write plain copies.
    await (await database()).identity.put({ key: 'current', user: toRaw(user.value), memberships: memberships.value.map(m => ({ ...toRaw(m) })), activeTeamId: activeTeamId.value, cachedAt: new Date().toISOString() })
  }

  async function loadProfile(): Promise<void> {
    await remember(await (await accounts()).fetchMe())
    status.value = 'signed-in'
  }

  let restoring: Promise<void> | null = null
  /** Once per app start: the cached identity first, then the server's word if there is signal. */
  function ready(): Promise<void> {
    restoring ??= (async () => {
      const cached = await readCachedIdentity()
      if (cached) {
        user.value = cached.user
        memberships.value = cached.memberships
        activeTeamId.value = cached.activeTeamId
      }
      // Nobody signed in on this phone: nothing to renew. Without signal, the cached identity stands.
      // Neither is an error, so neither asks the server (a refused or failed call is logged by the browser).
      if (!cached) {
        status.value = 'signed-out'
        return
      }
      if (!navigator.onLine) {
        status.value = 'offline'
        return
      }
      try {
        const session = await (await client()).refreshSession()
        if (session)
          await loadProfile()
        else
          status.value = 'expired'
      }
      catch (error) {
        if (!(error instanceof ApiError) || error.code !== 'network')
          throw error
        status.value = 'offline'
      }
    })()
    return restoring
  }

  void client().then(({ whenSessionEnds }) => whenSessionEnds(() => {
    status.value = user.value ? 'expired' : 'signed-out'
  }))

  async function signIn(email: string, password: string): Promise<void> {
    await (await accounts()).signIn(email, password)
    await loadProfile()
  }

  async function signUp(name: string, email: string, password: string): Promise<void> {
    await (await accounts()).signUp(name, email, password)
    await loadProfile()
  }

  async function signOut(): Promise<void> {
    await (await accounts()).signOut().catch(() => undefined)
    await (await database()).identity.delete('current')
    user.value = null
    memberships.value = []
    activeTeamId.value = null
    status.value = 'signed-out'
  }

  async function switchTeam(teamId: string): Promise<void> {
    activeTeamId.value = teamId
    await (await database()).identity.update('current', { activeTeamId: teamId })
  }

  return { status, user, memberships, activeTeamId, activeMembership, role, canManageTeam, actor, ready, signIn, signUp, signOut, switchTeam, reloadProfile: loadProfile }
})
