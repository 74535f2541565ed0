import type { VueWrapper } from '@vue/test-utils'
import { IonicVue } from '@ionic/vue'
import { flushPromises, mount } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import { defineComponent, h, provide } from 'vue'
import BrewReadings from '../../src/components/brew/BrewReadings.vue'
import BrewResultPanel from '../../src/components/brew/BrewResultPanel.vue'
import BrewWeights from '../../src/components/brew/BrewWeights.vue'
import GaugeCalibrationSession from '../../src/components/gauge/GaugeCalibrationSession.vue'
import { brewFormKey, useBrewForm } from '../../src/composables/useBrewForm'

/** The Bench's form parts around one form, as the Bench page wires them. */
const Harness = defineComponent({
  setup() {
    const { form, outcome } = useBrewForm()
    provide(brewFormKey, form)
    return () => h('div', [
      h(BrewWeights, { invalid: outcome.value.invalid, dose: outcome.value.result.dose, beverage: outcome.value.result.beverageMass }),
      h(BrewReadings, { summary: outcome.value.readings, invalid: outcome.value.invalid }),
      h(BrewResultPanel, { outcome: outcome.value }),
    ])
  },
})

/** Types the way Ionic reports it: an ionInput event with the new value. */
async function type(wrapper: VueWrapper, name: string, value: string): Promise<void> {
  wrapper.find(`[data-test="${name}"]`).element.dispatchEvent(new CustomEvent('ionInput', { detail: { value } }))
  await flushPromises()
}
const text = (wrapper: VueWrapper, name: string): string => wrapper.find(`[data-test="${name}"]`).element.innerHTML.replace(/<[^>]+>/g, '').replace(/\s+/g, ' ').trim()

async function addReading(wrapper: VueWrapper, value: string): Promise<void> {
  await type(wrapper, 'reading', value)
  await wrapper.find('form.add').trigger('submit')
  await flushPromises()
}

describe('the measure form', () => {
  it('says what is missing instead of showing a number', async () => {
    const wrapper = mount(Harness, { global: { plugins: [IonicVue] } })
    expect(text(wrapper, 'tds')).toBe('—')
    expect(text(wrapper, 'missing')).toContain('Add at least one reading.')
    expect(text(wrapper, 'missing')).toContain('Weigh the dose.')
  })

  it('computes the worked pour-over live from gross, tare and three readings', async () => {
    // Handbook worked example: 15.0 g, 240.0 g, 1.35 %TDS → 21.6 % (EY = TDS × beverage / dose).
    const wrapper = mount(Harness, { global: { plugins: [IonicVue] } })
    await type(wrapper, 'dose-gross', '27.5')
    await type(wrapper, 'dose-tare', '12.5')
    await type(wrapper, 'beverage-gross', '652.6')
    await type(wrapper, 'beverage-tare', '412.6')
    for (const value of ['1.34', '1.35', '1.36'])
      await addReading(wrapper, value)
    expect(text(wrapper, 'tds')).toBe('1.35')
    expect(text(wrapper, 'ey')).toBe('21.6')
    expect(text(wrapper, 'readings-summary')).toBe('Mean 1.350 from 3 readings, spread ± 0.010 (SD).')
    expect(text(wrapper, 'verdict')).toContain('In the zone')
  })

  it('flags a mass that is not a number beside its field', async () => {
    const wrapper = mount(Harness, { global: { plugins: [IonicVue] } })
    await type(wrapper, 'dose-tare', '12..5')
    const field = wrapper.find('[data-test="dose-tare"]')
    expect(field.classes()).toEqual(expect.arrayContaining(['ion-invalid', 'ion-touched']))
    expect(field.attributes('error-text')).toBe('Type a number of grams, such as 18.5.')
  })

  it('refuses a reading that is not a number and flags an outlier among the rest', async () => {
    const wrapper = mount(Harness, { global: { plugins: [IonicVue] } })
    await addReading(wrapper, 'one point three')
    expect(wrapper.find('[data-test="reading"]').attributes('error-text')).toContain('Type the reading in %TDS')
    // Dixon's Q for 1.38, 1.52, 1.37, 1.39: 0.867 > 0.829 (Rorabacher 1991, four readings, 95 %).
    for (const value of ['1.38', '1.52', '1.37', '1.39'])
      await addReading(wrapper, value)
    expect(text(wrapper, 'readings-summary')).toContain('1.52 looks like an outlier')
  })
})

describe('the calibration table', () => {
  it('fits the ICUMSA sucrose standards and hands the points over on accept', async () => {
    const wrapper = mount(GaugeCalibrationSession, { props: { kind: 'nD' }, global: { plugins: [IonicVue] } })
    await type(wrapper, 'zero-reading', '1.33299')
    expect(text(wrapper, 'zero-result')).toContain('Zero check passed')
    await wrapper.find('[data-test="sucrose-preset"]').trigger('click')
    await flushPromises()
    // The table's own nD for 0, 5, 10 and 15 °Brix (ICUMSA 1974).
    for (const [index, value] of ['1.33299', '1.34026', '1.34782', '1.35568'].entries())
      await type(wrapper, `reading-${index}`, value)
    expect(text(wrapper, 'r-squared')).toMatch(/^0\.99/)
    await wrapper.find('[data-test="accept-calibration"]').trigger('click')
    const accepted = wrapper.emitted('accept')?.[0]?.[0] as { standardUnit: string, points: unknown[] } | undefined
    expect(accepted?.standardUnit).toBe('brix')
    expect(accepted?.points).toEqual([{ concentration: 0, reading: 1.33299 }, { concentration: 5, reading: 1.34026 }, { concentration: 10, reading: 1.34782 }, { concentration: 15, reading: 1.35568 }])
  })

  it('warns about a standard that was mixed wrong', async () => {
    const wrapper = mount(GaugeCalibrationSession, { props: { kind: 'brix' }, global: { plugins: [IonicVue] } })
    const standards = [['0', '0.02'], ['5', '5.01'], ['10', '11.2'], ['15', '14.98'], ['20', '20.01']]
    await wrapper.findAll('ion-button').find(b => b.text().includes('Add a standard'))!.trigger('click')
    for (const [index, [concentration, reading]] of standards.entries()) {
      await type(wrapper, `standard-${index}`, concentration!)
      await type(wrapper, `reading-${index}`, reading!)
    }
    expect(text(wrapper, 'fit-warning')).toContain('Standard 3')
  })
})
