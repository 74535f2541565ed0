import type { VueWrapper } from '@vue/test-utils'
import type { RecipeSettings } from '../../shared/schemas/entities'
import type { Attempt } from '../../src/composables/useDialIn'
import { IonicVue } from '@ionic/vue'
import { flushPromises, mount } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import { defineComponent, h, ref } from 'vue'
import { computeBrew, findZonePreset, suggestNextChange, zonePresets, zoneVerdict } from '../../shared/brewing'
import DialInAttemptTable from '../../src/components/dialin/DialInAttemptTable.vue'
import DialInNext from '../../src/components/dialin/DialInNext.vue'
import RecipeBatchScaler from '../../src/components/recipe/RecipeBatchScaler.vue'
import RecipeFormFields from '../../src/components/recipe/RecipeFormFields.vue'
import { recipeFormOf } from '../../src/forms/recipeForm'
import { localRecord } from './records'

const plugins = [IonicVue]
const european = findZonePreset('european-drip')!
const text = (wrapper: VueWrapper, name: string): string => wrapper.find(`[data-test="${name}"]`).element.innerHTML.replace(/<[^>]+>/g, ' ').replace(/\s+/g, ' ').trim()
async function type(wrapper: VueWrapper, name: string, value: string): Promise<void> {
  wrapper.find(`[data-test="${name}"]`).element.dispatchEvent(new CustomEvent('ionInput', { detail: { value } }))
  await flushPromises()
}

function attempt(number: number, change: string, grind: string, tds: number, beverage: number): Attempt {
  const brew = localRecord('brew', { id: `brew-${number}`, method: 'percolation', dose: 15, beverageMass: beverage, grindSetting: grind, changeNote: change, brewedAt: `2026-12-02T11:0${number}:00.000Z`, derived: { tdsPercent: tds, yieldPercent: tds * beverage / 15 } })
  const yieldPercent = tds * beverage / 15
  return { number, brew, masses: computeBrew({ method: 'percolation', strengthSource: 'direct', readings: [tds], dose: 15, beverageMass: beverage }), tdsPercent: tds, yieldPercent, judged: { zone: european, source: 'the dial-in\'s zone' }, verdict: zoneVerdict(european, { tdsPercent: tds, yieldPercent }) }
}
const attempts = [attempt(1, '', '26 clicks', 1.1, 231), attempt(2, 'Two clicks finer', '24 clicks', 1.16, 230), attempt(3, 'Two more clicks finer', '22 clicks', 1.27, 229)]

describe('DialInAttemptTable', () => {
  it('lists the attempts in order with what changed, the settings and the result, and offers to adopt each', async () => {
    const wrapper = mount(DialInAttemptTable, { props: { attempts, adoptable: true, adoptedAs: (id: string) => (id === 'brew-3' ? 1 : undefined) }, global: { plugins } })
    // EY = 1.16 × 230 / 15 = 17.8 % (mass balance), under the European zone's 18 %.
    expect(text(wrapper, 'attempt-2')).toMatch(/^2 Two clicks finer 24 clicks · 15\.0 g → 230\.0 g .+ 1\.16 %TDS 17\.8 % EY Under-extracted and weak Adopt$/)
    expect(text(wrapper, 'attempt-1')).toContain('Starting point')
    expect(text(wrapper, 'adopted-3')).toBe('Adopted as version 1')
    expect(wrapper.find('[data-test="adopt-3"]').exists()).toBe(false)
    await wrapper.find('[data-test="adopt-2"]').trigger('click')
    expect(wrapper.emitted('adopt')![0]![0]).toMatchObject({ number: 2 })
  })

  it('offers no adoption to someone who may not change the recipe', () => {
    const wrapper = mount(DialInAttemptTable, { props: { attempts, adoptable: false, adoptedAs: () => undefined }, global: { plugins } })
    expect(wrapper.find('[data-test^="adopt-"]').exists()).toBe(false)
  })
})

describe('DialInNext', () => {
  it('shows each change with its size and the reasoning in one line', () => {
    const target = { tdsPercent: 1.325, yieldPercent: 20, zone: european }
    const suggestion = suggestNextChange({ method: 'percolation', dose: 15, beverageMass: 230, waterMass: null, tdsPercent: 1.16, yieldPercent: 1.16 * 230 / 15, grindSetting: '24 clicks', waterTemperatureC: 94 }, target, [])
    const wrapper = mount(DialInNext, { props: { suggestion, attempt: 2 }, global: { plugins } })
    expect(wrapper.findAll('li').map(li => li.text())).toEqual(suggestion.actions)
    expect(suggestion.actions[0]).toMatch(/^Raise the extraction 2\.2 points: grind finer/)
    expect(text(wrapper, 'dial-in-reasoning')).toContain('no grind step sized: the team\'s 0 similar percolation brews')
  })
})

describe('RecipeBatchScaler', () => {
  const filter: RecipeSettings = { name: 'Quay filter', method: 'percolation', dose: 15, waterMass: 250, targetTdsPercent: 1.3, targetYieldPercent: 20.5, grindSetting: '', contactTimeSeconds: null, waterTemperatureC: null, notes: '', beverageMass: 220, retainedRatio: 2, timeToleranceSeconds: null, zoneId: null, retired: false }

  it('scales to cups of the recipe\'s size and to litres, and says what is wrong with a batch it cannot make', async () => {
    const wrapper = mount(RecipeBatchScaler, { props: { settings: filter }, global: { plugins } })
    // Ten cups of 220 g: 2200 g at 14.667 g per gram → 150.0 g of coffee, 2200 + 2.0 × 150 = 2500.0 g of water.
    expect(text(wrapper, 'batch-result')).toBe('150.0 g of coffee in 2500.0 g of water for 2200.0 g of beverage: the grounds keep 300.0 g (LRR 2.0 g/g).')
    await type(wrapper, 'batch-cups', '0')
    expect(wrapper.find('[role="alert"]').text()).toBe('The number of cups must be a whole number from 1 to 10 000.')
  })
})

describe('RecipeFormFields', () => {
  it('solves the water from the target and the dose, and words the ratio the one way', async () => {
    const form = ref({ ...recipeFormOf(null), name: 'Fair filter', dose: '15', targetTds: '1.35', targetYield: '21.6' })
    const Harness = defineComponent({ setup: () => () => h(RecipeFormFields, { 'modelValue': form.value, 'onUpdate:modelValue': (value: typeof form.value) => (form.value = value), 'errors': {}, 'zones': [...zonePresets] }) })
    const wrapper = mount(Harness, { global: { plugins } })
    await wrapper.find('[data-test="recipe-solve"]').trigger('click')
    await flushPromises()
    // Handbook pour-over inverted: 15 g at 1.35 %TDS and 21.6 % is 240 g of beverage, 240 + 2.0 × 15 = 270 g of water.
    expect(form.value.mass).toBe('270.0')
    expect(text(wrapper, 'recipe-preview')).toBe('Brew ratio 1:16.0 (grams of beverage per gram of coffee) · about 240.0 g of beverage')
  })
})
