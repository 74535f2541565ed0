import { IonicVue } from '@ionic/vue'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import SignInPage from '../../src/views/SignInPage.vue'

async function mountSignIn() {
  const router = createRouter({
    history: createMemoryHistory(),
    routes: ['/sign-in', '/sign-up', '/forgot-password', '/bench'].map(path => ({ path, name: path.slice(1), component: { template: '<div />' } })),
  })
  await router.push('/sign-in')
  await router.isReady()
  return mount(SignInPage, { global: { plugins: [IonicVue, createPinia(), router] } })
}

/** Types into a field the way Ionic reports it: an ionInput event with the new value. */
function type(wrapper: Awaited<ReturnType<typeof mountSignIn>>, name: string, value: string): void {
  wrapper.find(`[data-test="${name}"]`).element.dispatchEvent(new CustomEvent('ionInput', { detail: { value } }))
}

const errorText = (wrapper: Awaited<ReturnType<typeof mountSignIn>>, name: string) => wrapper.find(`[data-test="${name}"]`).attributes('error-text')
const invalid = (wrapper: Awaited<ReturnType<typeof mountSignIn>>, name: string) => wrapper.find(`[data-test="${name}"]`).classes()

afterEach(() => {
  vi.unstubAllGlobals()
})

describe('SignInPage', () => {
  it('names each missing field beside it and sends nothing', async () => {
    const fetchSpy = vi.fn()
    vi.stubGlobal('fetch', fetchSpy)
    const wrapper = await mountSignIn()
    await wrapper.find('form').trigger('submit')
    // The form's schema loads with the first submit (it is kept out of the first screen's code).
    await vi.waitFor(() => expect(errorText(wrapper, 'email')).toBe('E-mail must be an e-mail address'))
    expect(errorText(wrapper, 'password')).toBe('Password must not be empty')
    expect(invalid(wrapper, 'email')).toEqual(expect.arrayContaining(['ion-invalid', 'ion-touched']))
    expect(fetchSpy).not.toHaveBeenCalled()
  })

  it('sends a valid form and shows the server\'s refusal', async () => {
    const fetchSpy = vi.fn(async () => new Response(JSON.stringify({ error: { code: 'wrong_credentials', message: 'Wrong e-mail or password.' } }), { status: 401 }))
    vi.stubGlobal('fetch', fetchSpy)
    const wrapper = await mountSignIn()
    type(wrapper, 'email', ' Dora@Kestrel-Quay.test ')
    type(wrapper, 'password', 'not the password')
    await wrapper.find('form').trigger('submit')
    await vi.waitFor(() => expect(wrapper.find('[role="alert"]').exists()).toBe(true))
    await flushPromises()
    expect(fetchSpy).toHaveBeenCalledWith('/api/v1/auth/login', expect.objectContaining({ method: 'POST', body: JSON.stringify({ email: 'dora@kestrel-quay.test', password: 'not the password' }) }))
    expect(wrapper.find('[role="alert"]').text()).toBe('Wrong e-mail or password.')
    expect(errorText(wrapper, 'email')).toBeUndefined()
  })
})
