import { IonicVue } from '@ionic/vue'
import { mount } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { nextTick } from 'vue'
import ShellNetworkChip from '../../src/components/shell/ShellNetworkChip.vue'
import { presentToast } from '../../src/overlays/toast'

// The toast itself is Ionic's; here we check what the chip asks it to say.
vi.mock('../../src/overlays/toast', () => ({ presentToast: vi.fn(async () => {}) }))

/** The chip's words. Stencil patches textContent on scoped elements, which happy-dom leaves empty. */
const label = (wrapper: ReturnType<typeof mount>): string => wrapper.find('ion-label').element.innerHTML.trim()

function setOnline(online: boolean): void {
  vi.spyOn(navigator, 'onLine', 'get').mockReturnValue(online)
  window.dispatchEvent(new Event(online ? 'online' : 'offline'))
}

afterEach(() => {
  vi.restoreAllMocks()
})

describe('shellNetworkChip', () => {
  it('shows the network state and tells the person when it changes', async () => {
    vi.spyOn(navigator, 'onLine', 'get').mockReturnValue(true)
    const wrapper = mount(ShellNetworkChip, { global: { plugins: [IonicVue, createPinia()] } })
    expect(label(wrapper)).toBe('Online')

    setOnline(false)
    await nextTick()
    expect(label(wrapper)).toBe('Offline')
    expect(wrapper.attributes('aria-label')).toBe('Offline')
    expect(presentToast).toHaveBeenLastCalledWith(expect.objectContaining({ message: expect.stringContaining('entries stay on this phone') }))

    setOnline(true)
    await nextTick()
    expect(label(wrapper)).toBe('Online')
    expect(presentToast).toHaveBeenCalledTimes(2)
    wrapper.unmount()
  })
})
