import type { SyncEngine, SyncStatus } from '../sync/engine'
import type { Uploader, UploadStatus } from '../sync/uploads'
import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { apiUploads } from '../api/upload'
import { refreshMembers } from '../composables/useMembers'
import { db } from '../db/database'
import { createSyncEngine } from '../sync/engine'
import { apiTransport } from '../sync/transport'
import { createUploader } from '../sync/uploads'
import { useSessionStore } from './session'

/** Unsynced changes older than this risk being lost if the browser clears old site data. */
const staleAfterMs = 3 * 24 * 60 * 60 * 1000
const intervalMs = 30_000

/** Sync status for the shell: what waits, when it last went through, what needs the person. */
export const useSyncStore = defineStore('sync', () => {
  const status = ref<SyncStatus>({ state: 'idle', pending: 0, attention: 0, lastSyncedAt: null, oldestPendingAt: null, error: null, progress: null })
  const persisted = ref<boolean | null>(null)
  const stale = computed(() => status.value.oldestPendingAt !== null && Date.now() - Date.parse(status.value.oldestPendingAt) > staleAfterMs)
  const uploads = ref<UploadStatus>({ waiting: 0, sending: null, failed: 0 })
  let engine: SyncEngine | null = null
  let uploader: Uploader | null = null

  /** Records first (a file's record names what it shows), then the files waiting to upload. */
  async function syncNow(): Promise<void> {
    await engine?.syncNow()
    await uploader?.uploadNow()
    if (engine?.status().state === 'idle')
      void keepMembers()
  }

  /**
   * Teammates' names for "recorded by" lines, on screen and in exports, kept on the phone once per
   * app start after a sync went through, so they are there offline even on screens never opened online.
   */
  const membersKept = new Set<string>()
  async function keepMembers(): Promise<void> {
    for (const { teamId } of useSessionStore().memberships) {
      if (membersKept.has(teamId))
        continue
      membersKept.add(teamId)
      await refreshMembers(teamId).catch(() => membersKept.delete(teamId))
    }
  }

  /** Once, after sign-in: sync when signal returns, when the app comes back, and every 30 s. */
  async function start(): Promise<void> {
    if (engine)
      return
    const session = useSessionStore()
    engine = createSyncEngine({
      database: db,
      transport: apiTransport,
      teamIds: () => session.memberships.map(m => m.teamId),
      isOnline: () => navigator.onLine,
      onStatus: (next) => {
        status.value = next
      },
    })
    uploader = createUploader({
      database: db,
      transport: apiUploads,
      isOnline: () => navigator.onLine,
      onStatus: (next) => {
        uploads.value = next
      },
    })
    window.addEventListener('online', () => void syncNow())
    document.addEventListener('visibilitychange', () => {
      if (document.visibilityState === 'visible')
        void syncNow()
    })
    setInterval(() => {
      if (navigator.onLine && session.status === 'signed-in')
        void syncNow()
    }, intervalMs)
    // Ask the browser not to evict this site's IndexedDB; it may still say no.
    persisted.value = (await navigator.storage?.persist?.().catch(() => false)) ?? false
    await engine.refreshStatus()
    await uploader.refreshStatus()
    if (navigator.onLine)
      void syncNow()
  }

  /** Recounts what waits (after the person settled a conflict or a refusal on this phone). */
  async function refresh(): Promise<void> {
    await engine?.refreshStatus()
    await uploader?.refreshStatus()
  }

  return { status, uploads, persisted, stale, start, syncNow, refresh }
})
