import type { Ref } from 'vue'
import { onScopeDispose, ref } from 'vue'

/**
 * Whether the browser believes it has a network. `navigator.onLine` can say yes on a captive
 * Wi-Fi with no internet; the sync layer learns the truth from its own requests.
 */
export function useOnline(): { online: Ref<boolean> } {
  const online = ref(typeof navigator === 'undefined' ? true : navigator.onLine)
  const update = (): void => {
    online.value = navigator.onLine
  }
  window.addEventListener('online', update)
  window.addEventListener('offline', update)
  onScopeDispose(() => {
    window.removeEventListener('online', update)
    window.removeEventListener('offline', update)
  })
  return { online }
}
