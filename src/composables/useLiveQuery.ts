import type { Ref, WatchSource } from 'vue'
import { liveQuery } from 'dexie'
import { onScopeDispose, ref, shallowRef, watch } from 'vue'

export type QueryState = 'loading' | 'done' | 'error'

/**
 * A Dexie query as Vue state, re-run whenever the tables it read change (on this tab or another),
 * and started again when `deps` change: Dexie cannot see the Vue state a query reads (the team,
 * a route parameter), so whatever it reads is passed as deps.
 */
export function useLiveQuery<T>(query: () => Promise<T>, initial: T, deps?: WatchSource): { state: Ref<QueryState>, value: Ref<T>, error: Ref<unknown> } {
  const state = ref<QueryState>('loading')
  const value = shallowRef<T>(initial) as Ref<T>
  const error = ref<unknown>(null)
  let subscription: { unsubscribe: () => void } | null = null
  function start(): void {
    subscription?.unsubscribe()
    subscription = liveQuery(query).subscribe({
      next: (next) => {
        value.value = next
        state.value = 'done'
      },
      error: (failure: unknown) => {
        error.value = failure
        state.value = 'error'
      },
    })
  }
  start()
  if (deps)
    watch(deps, start, { deep: true })
  onScopeDispose(() => subscription?.unsubscribe())
  return { state, value, error }
}
