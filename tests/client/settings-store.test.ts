import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import { nextTick } from 'vue'
import { useSettingsStore } from '../../src/stores/settings'

beforeEach(() => {
  localStorage.clear()
  document.documentElement.className = ''
  setActivePinia(createPinia())
})

describe('useSettingsStore', () => {
  it('follows the phone by default', () => {
    expect(useSettingsStore().theme).toBe('system')
  })

  it('applies and keeps a dark choice', async () => {
    const settings = useSettingsStore()
    settings.theme = 'dark'
    await nextTick()
    expect(document.documentElement.classList.contains('ion-palette-dark')).toBe(true)
    setActivePinia(createPinia())
    expect(useSettingsStore().theme).toBe('dark')
  })

  it('ignores a damaged stored value', () => {
    localStorage.setItem('lixivia.settings', '{not json')
    expect(useSettingsStore().theme).toBe('system')
  })

  it('resets to following the phone and forgets the choice', async () => {
    const settings = useSettingsStore()
    settings.theme = 'light'
    await nextTick()
    settings.reset()
    await nextTick()
    expect(settings.theme).toBe('system')
    expect(localStorage.getItem('lixivia.settings')).toBeNull()
  })
})
