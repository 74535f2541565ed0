import type { Ref } from 'vue'
import { onScopeDispose, ref, watch } from 'vue'
import { fetchPhoto } from '../api/photos'
import { db } from '../db/database'
import { localPhotoBlob } from '../sync/photos'

/**
 * An object URL for a photo: from the phone's own copy (a photo taken here, or a teammate's fetched
 * before), else fetched from the team server and kept for next time. The URL is revoked when the
 * photo changes or the component goes.
 */
export function usePhotoUrl(photo: Ref<{ id: string, teamId: string } | null>) {
  const url = ref<string | null>(null)
  const state = ref<'loading' | 'done' | 'missing'>('loading')
  let current: string | null = null
  const release = (): void => {
    if (current)
      URL.revokeObjectURL(current)
    current = null
  }

  async function load(target: { id: string, teamId: string } | null): Promise<void> {
    release()
    url.value = null
    state.value = 'loading'
    if (!target)
      return
    let blob = await localPhotoBlob(db, target.id)
    if (!blob && navigator.onLine) {
      blob = await fetchPhoto(target.teamId, target.id).catch(() => null)
      if (blob)
        await db.photoFiles.put({ id: target.id, teamId: target.teamId, blob, fetchedAt: new Date().toISOString() })
    }
    if (photo.value?.id !== target.id)
      return
    if (!blob) {
      state.value = 'missing'
      return
    }
    current = URL.createObjectURL(blob)
    url.value = current
    state.value = 'done'
  }

  watch(() => photo.value?.id, () => void load(photo.value), { immediate: true })
  onScopeDispose(release)
  return { url, state, reload: () => load(photo.value) }
}
