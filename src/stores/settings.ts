import { defineStore } from 'pinia'
import { ref, watch } from 'vue'

export type ThemeChoice = 'system' | 'light' | 'dark'

const storageKey = 'lixivia.settings'

interface StoredSettings { theme: ThemeChoice }

function load(): StoredSettings {
  try {
    const stored = JSON.parse(localStorage.getItem(storageKey) ?? '{}') as Partial<StoredSettings>
    return { theme: stored.theme === 'light' || stored.theme === 'dark' ? stored.theme : 'system' }
  }
  catch {
    return { theme: 'system' }
  }
}

/** Display preferences of this phone (never tokens or team data, which live elsewhere). */
export const useSettingsStore = defineStore('settings', () => {
  const theme = ref<ThemeChoice>(load().theme)
  const darkQuery = typeof window.matchMedia === 'function' ? window.matchMedia('(prefers-color-scheme: dark)') : undefined

  function applyTheme(): void {
    const dark = theme.value === 'dark' || (theme.value === 'system' && darkQuery?.matches === true)
    document.documentElement.classList.toggle('ion-palette-dark', dark)
  }

  function reset(): void {
    theme.value = 'system'
  }

  darkQuery?.addEventListener('change', applyTheme)
  watch(theme, (value) => {
    // Following the phone is the default, so it is stored as nothing at all.
    if (value === 'system')
      localStorage.removeItem(storageKey)
    else
      localStorage.setItem(storageKey, JSON.stringify({ theme: value } satisfies StoredSettings))
    applyTheme()
  })

  return { theme, applyTheme, reset }
})
