import type { Role } from '../../shared/schemas/auth'
import { IonicVue } from '@ionic/vue'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it } from 'vitest'
import OriginLotDecision from '../../src/components/origin/OriginLotDecision.vue'
import OriginLotForm from '../../src/components/origin/OriginLotForm.vue'
import { db } from '../../src/db/database'
import { lotDataOf, lotFormOf } from '../../src/forms/lotForm'
import { useSessionStore } from '../../src/stores/session'
import { localRecord } from './records'

const teamId = '0190a8c4-0000-7000-8000-0000000000aa'
const me = { id: '0190a8c4-0000-7000-8000-0000000000bb', email: 'mats@kestrel-quay.test', name: 'Mats Quillon' }
const tripId = '0190a8c4-0000-7000-8000-0000000000dd'

function signedIn(role: Role) {
  const pinia = createPinia()
  setActivePinia(pinia)
  const session = useSessionStore()
  session.user = me
  session.memberships = [{ teamId, teamName: 'Kestrel Quay Tasting Crew', role }]
  session.activeTeamId = teamId
  return pinia
}
/** Types into an Ionic field the way Ionic reports it. */
const type = (wrapper: ReturnType<typeof mount>, name: string, value: string) => wrapper.find(`[data-test="${name}"]`).element.dispatchEvent(new CustomEvent('ionInput', { detail: { value } }))

beforeEach(async () => {
  await db.lots.clear()
  await db.outbox.clear()
})

describe('OriginLotForm', () => {
  it('names each field that cannot be read beside it, and emits nothing', async () => {
    const wrapper = mount(OriginLotForm, { props: { tripId }, global: { plugins: [IonicVue, signedIn('member')] } })
    type(wrapper, 'lot-moisturePercent', '10.8.1')
    type(wrapper, 'lot-waterActivity', '1.4')
    type(wrapper, 'lot-currency', 'euro')
    await wrapper.find('form').trigger('submit')
    await flushPromises()
    expect(wrapper.find('[data-test="lot-farm"]').attributes('error-text')).toBe('Farm or producer must not be empty.')
    expect(wrapper.find('[data-test="lot-moisturePercent"]').attributes('error-text')).toBe('Moisture (%) must be a number.')
    expect(wrapper.find('[data-test="lot-waterActivity"]').attributes('error-text')).toBe('Water activity (aw) must be at most 1.')
    expect(wrapper.find('[data-test="lot-currency"]').attributes('error-text')).toBe('Currency must be a three-letter currency code.')
    expect(wrapper.emitted('save')).toBeUndefined()
  })

  it('emits the lot with a decimal comma read and the lot size from its bags', async () => {
    const wrapper = mount(OriginLotForm, { props: { tripId }, global: { plugins: [IonicVue, signedIn('member')] } })
    type(wrapper, 'lot-farm', 'Fernhollow Terraces')
    type(wrapper, 'lot-moisturePercent', '10,9')
    type(wrapper, 'lot-bags', '20')
    type(wrapper, 'lot-bagKg', '69')
    type(wrapper, 'lot-currency', 'eur')
    await wrapper.find('form').trigger('submit')
    expect(wrapper.emitted('save')?.[0]?.[0]).toMatchObject({ tripId, farm: 'Fernhollow Terraces', moisturePercent: 10.9, bags: 20, bagKg: 69, lotSizeKg: 1380, currency: 'EUR', defectSampleG: 350, priceUnit: 'kg' })
  })

  it('leaves a lot\'s decision out of an edit of its fields', () => {
    const lot = localRecord('lot', { farm: 'Alder Ridge Estate', decision: 'claim', decisionReason: 'Even bowls', moisturePercent: 10.8, priceUnit: 'lb' })
    const { data } = lotDataOf(lotFormOf(lot), tripId)
    expect(data).toMatchObject({ farm: 'Alder Ridge Estate', moisturePercent: 10.8, priceUnit: 'lb' })
    expect(data).not.toHaveProperty('decision')
  })
})

describe('OriginLotDecision', () => {
  it('asks for a reason before it keeps a claim, then keeps both with the lot', async () => {
    const lot = { ...localRecord('lot', { id: '0190a8c4-0000-7000-8000-0000000000ee', createdBy: me.id, tripId, farm: 'Alder Ridge Estate', decision: 'open', decisionReason: '' }), teamId }
    await db.lots.put(lot)
    const wrapper = mount(OriginLotDecision, { props: { lot }, global: { plugins: [IonicVue, signedIn('member')] } })
    wrapper.find('[data-test="decision-choice"]').element.dispatchEvent(new CustomEvent('ionChange', { detail: { value: 'claim' } }))
    await flushPromises()
    expect(wrapper.text()).toContain('We want this lot: make the offer.')
    await wrapper.find('form').trigger('submit')
    await flushPromises()
    expect(wrapper.find('[role="alert"]').text()).toBe('Reason: say why, so the team at home can follow the decision.')
    expect(await db.outbox.count()).toBe(0)
    await wrapper.find('[data-test="decision-reason"]').setValue('Clean and sweet, fair price')
    await wrapper.find('form').trigger('submit')
    await flushPromises()
    expect(await db.lots.get(lot.id)).toMatchObject({ decision: 'claim', decisionReason: 'Clean and sweet, fair price', sync: { state: 'pending' } })
    expect(wrapper.emitted('saved')).toHaveLength(1)
  })

  it('lets a member only read a teammate\'s decision', async () => {
    const lot = { ...localRecord('lot', { createdBy: 'someone-else', farm: 'Copperbeck Farm', decision: 'pass', decisionReason: 'Tainted cup' }), teamId }
    const wrapper = mount(OriginLotDecision, { props: { lot }, global: { plugins: [IonicVue, signedIn('member')] } })
    expect(wrapper.find('[data-test="decision-save"]').exists()).toBe(false)
    expect(wrapper.text()).toContain('Only the person who added this lot, or a lead, can decide on it.')
  })
})
