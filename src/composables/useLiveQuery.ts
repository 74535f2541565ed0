import type { Ref } from 'vue'
import { liveQuery } from 'dexie'
import { onScopeDispose, ref, shallowRef } from 'vue'

export type QueryState = 'loading' | 'done' | 'error'

/** A Dexie query as Vue state, re-run whenever the tables it read change (on this tab or another). */
export function useLiveQuery<T>(query: () => Promise<T>, initial: T): { state: Ref<QueryState>, value: Ref<T>, error: Ref<unknown> } {
  const state = ref<QueryState>('loading')
  const value = shallowRef<T>(initial) as Ref<T>
  const error = ref<unknown>(null)
  const subscription = liveQuery(query).subscribe({
    next: (next) => {
      value.value = next
      state.value = 'done'
    },
    error: (failure: unknown) => {
      error.value = failure
      state.value = 'error'
    },
  })
  onScopeDispose(() => subscription.unsubscribe())
  return { state, value, error }
}
