import type { Ref } from 'vue'
import { onScopeDispose, ref } from 'vue'

/** Whether the app is drawn dark now (the class the settings store puts on the root), for canvases. */
export function useDarkMode(): Ref<boolean> {
  const root = document.documentElement
  const dark = ref(root.classList.contains('ion-palette-dark'))
  const observer = new MutationObserver(() => {
    dark.value = root.classList.contains('ion-palette-dark')
  })
  observer.observe(root, { attributes: true, attributeFilter: ['class'] })
  onScopeDispose(() => observer.disconnect())
  return dark
}
