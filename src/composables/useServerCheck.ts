import type { Ref } from 'vue'
import { ref } from 'vue'
import { ApiError, fetchHealth } from '../api/client'

export type CheckState = 'idle' | 'loading' | 'done' | 'error'

/** Asks the team server whether it and its database answer, and words the result for a person. */
export function useServerCheck(): { state: Ref<CheckState>, message: Ref<string>, check: () => Promise<void> } {
  const state = ref<CheckState>('idle')
  const message = ref('')

  async function check(): Promise<void> {
    state.value = 'loading'
    try {
      const health = await fetchHealth()
      message.value = health.db === 'up'
        ? `Team server reachable (version ${health.version}); its database is up.`
        : 'The team server answers, but its database is down. Entries wait on this phone.'
      state.value = health.db === 'up' ? 'done' : 'error'
    }
    catch (error) {
      message.value = error instanceof ApiError ? error.message : 'The team server check failed.'
      state.value = 'error'
    }
  }

  return { state, message, check }
}
