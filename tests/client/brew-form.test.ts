import type { VueWrapper } from '@vue/test-utils'
import type { BrewForm } from '../../src/composables/useBrewForm'
import type { Gauge } from '../../src/composables/useGauges'
import { IonicVue } from '@ionic/vue'
import { flushPromises, mount } from '@vue/test-utils'
import { linearRegression } from 'simple-statistics'
import { describe, expect, it } from 'vitest'
import { defineComponent, h, provide, ref } from 'vue'
import { findZonePreset } from '../../shared/brewing'
import BrewReadings from '../../src/components/brew/BrewReadings.vue'
import BrewResultPanel from '../../src/components/brew/BrewResultPanel.vue'
import BrewStrengthSource from '../../src/components/brew/BrewStrengthSource.vue'
import BrewWeights from '../../src/components/brew/BrewWeights.vue'
import GaugeCalibrationSession from '../../src/components/gauge/GaugeCalibrationSession.vue'
import { brewFormKey, emptyBrewForm, useBrewForm } from '../../src/composables/useBrewForm'
import { gaugeOf } from '../../src/composables/useGauges'
import { localRecord } from './records'

// An nD refractometer and a line through the ICUMSA table's nD for 0, 5, 10 and 15 °Brix sucrose.
const harbour = localRecord('instrument', { id: 'gauge-1', label: 'Harbour gauge', readingKind: 'nD', resolution: 0.00001, repeatability: 0.00002 })
const sucroseLine = localRecord('calibration', { id: 'cal-1', instrumentId: 'gauge-1', standardUnit: 'brix', active: true, calibratedAt: '2026-12-01T08:00:00.000Z', points: [[0, 1.33299], [5, 1.34026], [10, 1.34782], [15, 1.35568]].map(([concentration, reading]) => ({ concentration: concentration!, reading: reading! })) })

/** The form of the harness mounted last, for tests that change what a segment would. */
let mounted: BrewForm

/** The Bench's form parts around one form, as the Bench page wires them. */
function harness(gauge: Gauge | null = null, initial: Partial<BrewForm> = {}) {
  return defineComponent({
    setup() {
      const { form, outcome } = useBrewForm({ ...emptyBrewForm(), ...initial, instrumentId: gauge?.instrument.id ?? null }, { gauges: ref(new Map(gauge ? [[gauge.instrument.id, gauge]] : [])), judge: () => ({ zone: findZonePreset('us-drip')!, source: 'the team\'s default' }) })
      provide(brewFormKey, form)
      mounted = form
      return () => h('div', [
        h(BrewStrengthSource, { gauges: gauge ? [gauge] : [], gauge, strength: outcome.value.strength, invalid: outcome.value.invalid }),
        h(BrewWeights, { invalid: outcome.value.invalid, dose: outcome.value.result.dose, beverage: outcome.value.result.beverageMass, estimated: outcome.value.result.beverageEstimated }),
        h(BrewReadings, { summary: outcome.value.readings, outlier: outcome.value.outlier, kind: outcome.value.strength.kind }),
        h(BrewResultPanel, { outcome: outcome.value }),
      ])
    },
  })
}
const Harness = harness()

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
    // Left out by default: the mean is of the other three, and one tap keeps it.
    expect(text(wrapper, 'outlier')).toContain('1.52 is left out of the result as an outlier (Dixon\'s Q 0.87 is above 0.829 at 95 %)')
    expect(text(wrapper, 'readings-summary')).toBe('Mean 1.380 from 3 readings, spread ± 0.010 (SD).')
    await wrapper.find('[data-test="keep-outlier"]').trigger('click')
    expect(text(wrapper, 'outlier')).toContain('1.52 looks like an outlier (Dixon\'s Q 0.87 is above 0.829 at 95 %) but is kept')
    expect(text(wrapper, 'readings-summary')).toContain('Mean 1.415 from 4 readings')
  })
})

describe('the measure form with a refractometer', () => {
  it('goes through the instrument\'s active calibration and says so', async () => {
    const wrapper = mount(harness(gaugeOf(harbour, sucroseLine)), { global: { plugins: [IonicVue] } })
    expect(text(wrapper, 'strength-line')).toContain('through the calibration of')
    expect(text(wrapper, 'strength-line')).toContain('4 sucrose °Brix standards')
    // A coffee reading of nD 1.33570 through the same line fitted by simple-statistics (an
    // independent library), times the common-practice factor 0.85.
    const line = linearRegression((sucroseLine.points as { concentration: number, reading: number }[]).map(p => [p.concentration, p.reading]))
    const expected = 0.85 * (1.3357 - line.b) / line.m
    await addReading(wrapper, '1.3357')
    expect(text(wrapper, 'tds')).toBe(expected.toFixed(2))
    expect((wrapper.find('[data-test="reading"]').element as HTMLElement & { label: string }).label).toBe('Reading (nD)')
  })

  it('refuses an nD reading no refractometer shows', async () => {
    const wrapper = mount(harness(gaugeOf(harbour, sucroseLine)), { global: { plugins: [IonicVue] } })
    await addReading(wrapper, '13.4')
    expect(wrapper.find('[data-test="reading"]').attributes('error-text')).toBe('Type the reading in nD, such as 1.3357.')
  })

  it('asks for a calibration before an uncalibrated nD instrument gives a result', async () => {
    const wrapper = mount(harness(gaugeOf(harbour, null)), { global: { plugins: [IonicVue] } })
    await addReading(wrapper, '1.3357')
    expect(text(wrapper, 'strength-line')).toContain('has no active calibration')
    expect(text(wrapper, 'missing')).toContain('Calibrate this refractometer')
    expect(text(wrapper, 'tds')).toBe('—')
  })
})

describe('the measure form\'s LRR and immersion', () => {
  it('shows the common-practice LRR and follows the method until the person types another', async () => {
    const wrapper = mount(Harness, { global: { plugins: [IonicVue] } })
    // LRR 2.0 g/g for paper-filter percolation and 3 g/g for immersion: common practice.
    const lrr = () => (wrapper.find('[data-test="lrr"]').element as HTMLInputElement).value
    expect(lrr()).toBe('2.0')
    mounted.method = 'immersion'
    await flushPromises()
    expect(lrr()).toBe('3.0')
    await type(wrapper, 'lrr', '2.6')
    mounted.method = 'percolation'
    await flushPromises()
    expect(lrr()).toBe('2.6')
  })

  it('gives an espresso its ratio from the beverage, never from water a recipe left in the hidden field', async () => {
    // 36 g from 18 g is 1:2.0; the 250 g of filter water once gave 250 / 18 = 1:13.9.
    const wrapper = mount(harness(null, { method: 'espresso', byDifference: false, dose: '18', beverageMass: '36', waterMass: '250' }), { global: { plugins: [IonicVue] } })
    await addReading(wrapper, '10')
    expect(text(wrapper, 'ratio')).toBe('Brew ratio 1:2.0 (grams of beverage per gram of coffee)')
    // EY = 10 × 36 / 18 = 20.0 %: from the weighed shot, not from the water.
    expect(text(wrapper, 'ey')).toBe('20.0')
    mounted.beverageMass = ''
    await flushPromises()
    expect(wrapper.find('[data-test="ratio"]').exists()).toBe(false)
    expect(text(wrapper, 'missing')).toContain('Weigh the beverage')
  })

  it('words a percolation\'s ratio the same way, from the beverage the yield used', async () => {
    // 240 g from 15 g: 1:16.0, grams of beverage per gram of coffee (the chart's lines).
    const wrapper = mount(harness(null, { byDifference: false, dose: '15', beverageMass: '240', waterMass: '270' }), { global: { plugins: [IonicVue] } })
    expect(text(wrapper, 'ratio')).toBe('Brew ratio 1:16.0 (grams of beverage per gram of coffee)')
  })

  it('takes an immersion from the poured-off beverage and the LRR when no water is given', async () => {
    // EY = TDS × (beverage + LRR × dose) / dose = 1.20 × (150 + 3 × 10) / 10 = 21.6 % (mass balance).
    const wrapper = mount(harness(null, { method: 'immersion', byDifference: false, dose: '10', beverageMass: '150', retainedRatio: '3.0' }), { global: { plugins: [IonicVue] } })
    await addReading(wrapper, '1.2')
    expect(text(wrapper, 'ey')).toBe('21.6')
    expect(text(wrapper, 'basis')).toContain('poured off plus 3.0 g/g')
  })
})

describe('stored readings in the form', () => {
  it('are set aside and brought back, never removed, and the mean follows', async () => {
    // Stored readings come back as they were used (formOfBrew keeps them), outlier or not.
    const readings = [1.34, 1.35, 1.36, 1.52].map((value, index) => ({ id: `reading-${index}`, value, excluded: false, kept: true }))
    const wrapper = mount(harness(null, { readings, byDifference: false, dose: '15', beverageMass: '240' }), { global: { plugins: [IonicVue] } })
    expect(text(wrapper, 'outlier')).toContain('1.52 looks like an outlier')
    const chips = () => wrapper.findAll('[data-test="readings"] ion-chip')
    await chips()[3]!.trigger('click')
    expect(chips()).toHaveLength(4)
    expect(chips()[3]!.classes()).toContain('excluded')
    expect(text(wrapper, 'tds')).toBe('1.35')
    await chips()[3]!.trigger('click')
    expect(text(wrapper, 'tds')).toBe('1.39')
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
