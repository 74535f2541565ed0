import type { InjectionKey, Ref } from 'vue'
import type { BrewInput, BrewMethod, BrewRatio, BrewResult, BrewUncertainty, ReadingKind, ReadingsSummary, Zone, ZoneVerdict } from '../../shared/brewing'
import type { BrewContext } from '../../shared/schemas/entities'
import type { JudgedZone } from './brewContexts'
import type { Gauge } from './useGauges'
import { computed, inject, reactive, watch } from 'vue'
import { brewRatioOf, brewUncertainty, computeBrew, defaultRetainedRatio, summarizeReadings, zoneVerdict } from '../../shared/brewing'
import { readDuration, readNumber } from '../forms/numbers'

/**
 * One reading in the form: stored ones carry their id and can only be set aside, never removed.
 * `kept`: the person chose to keep a reading Dixon's Q flags, which is otherwise left out.
 */
export interface BrewFormReading { value: number, id?: string, excluded: boolean, kept?: boolean }

/** What the person types, as typed: numbers stay text until they are read. */
export interface BrewForm {
  context: BrewContext
  method: BrewMethod
  /** The refractometer used, or null for readings typed as %TDS or °Brix without one. */
  instrumentId: string | null
  manualSource: 'direct' | 'brix-factor'
  brixFactor: string
  byDifference: boolean
  dose: string
  doseGross: string
  doseTare: string
  beverageMass: string
  beverageGross: string
  beverageTare: string
  waterMass: string
  retainedRatio: string
  grindSetting: string
  contactTime: string
  waterTemperature: string
  notes: string
  readings: BrewFormReading[]
  /** For an attempt of a dial-in session: what changed since the attempt before. */
  changeNote: string
}

export const lrrText = (method: BrewMethod): string => (method === 'immersion' ? defaultRetainedRatio.immersion : defaultRetainedRatio.percolation).toFixed(1)

export function emptyBrewForm(): BrewForm {
  return {
    context: { kind: 'quick', refId: null },
    method: 'percolation',
    instrumentId: null,
    manualSource: 'direct',
    brixFactor: '0.85',
    byDifference: true,
    dose: '',
    doseGross: '',
    doseTare: '',
    beverageMass: '',
    beverageGross: '',
    beverageTare: '',
    waterMass: '',
    retainedRatio: lrrText('percolation'),
    grindSetting: '',
    contactTime: '',
    waterTemperature: '',
    notes: '',
    readings: [],
    changeNote: '',
  }
}

/** Scale resolution (g) assumed for the ±: most brew scales show 0.1 g (common practice). */
export const scaleResolution = 0.1
/** Repeatability of one reading when no instrument is chosen (common practice, in the readings' unit). */
const manualRepeatability = { 'direct': 0.02, 'brix-factor': 0.05 } as const

/** How the readings become %TDS, decided by the instrument chosen and its active calibration. */
export interface StrengthSource {
  source: BrewInput['strengthSource']
  kind: ReadingKind
  calibration: BrewInput['calibration']
  /** Whether a °Brix factor takes part (°Brix readings, or a line fitted to sucrose standards). */
  usesFactor: boolean
  repeatability: number
}

export function strengthSourceOf(gauge: Gauge | null, manualSource: BrewForm['manualSource']): StrengthSource {
  if (!gauge)
    return { source: manualSource, kind: manualSource === 'direct' ? 'tds' : 'brix', calibration: null, usesFactor: manualSource === 'brix-factor', repeatability: manualRepeatability[manualSource] }
  const repeatability = gauge.instrument.repeatability
  if (gauge.fit)
    return { source: 'calibration', kind: gauge.kind, calibration: { fit: gauge.fit, standardUnit: gauge.standardUnit! }, usesFactor: gauge.standardUnit === 'brix', repeatability }
  // Not calibrated: %TDS and °Brix readings still work; nD readings need a line.
  const source = gauge.kind === 'tds' ? 'direct' : gauge.kind === 'brix' ? 'brix-factor' : 'calibration'
  return { source, kind: gauge.kind, calibration: null, usesFactor: source === 'brix-factor', repeatability }
}

export interface BrewOutcome {
  input: BrewInput
  result: BrewResult
  strength: StrengthSource
  /** Mean and spread of the readings the result uses. */
  readings: ReadingsSummary | null
  /**
   * The reading Dixon's Q flags among those not set aside (its index is into form.readings), and
   * whether it is left out of the result: it is unless the person keeps it.
   */
  outlier: (NonNullable<ReadingsSummary['outlier']> & { leftOut: boolean }) | null
  uncertainty: BrewUncertainty | null
  verdict: ZoneVerdict | null
  /** Brew ratio, grams of beverage per gram of coffee (shared/brewing/ratio.ts), once the masses give it. */
  ratio: BrewRatio | null
  /** The zone the verdict is against (the context's, else the team's default), and why. */
  zone: Zone
  zoneSource: string
  /** Fields whose text is not a number, by form field name. */
  invalid: string[]
}

const numberFields = ['brixFactor', 'dose', 'doseGross', 'doseTare', 'beverageMass', 'beverageGross', 'beverageTare', 'waterMass', 'retainedRatio', 'waterTemperature'] as const

/** The measure form and its live result, for the Bench and for editing a stored brew. */
export function useBrewForm(initial: BrewForm, options: { gauges: Ref<ReadonlyMap<string, Gauge>>, judge: (context: BrewContext, method: BrewMethod) => JudgedZone }) {
  const form = reactive<BrewForm>(structuredClone(initial))
  /** The chosen refractometer with its active calibration (null: none, or not on this phone). */
  const gauge = computed(() => (form.instrumentId ? options.gauges.value.get(form.instrumentId) ?? null : null))
  // The LRR field shows the method's common-practice default until the person types another.
  watch(() => form.method, (method, previous) => {
    if (form.retainedRatio === lrrText(previous))
      form.retainedRatio = lrrText(method)
  })

  const outcome = computed<BrewOutcome>(() => {
    const read = Object.fromEntries(numberFields.map(field => [field, readNumber(form[field])])) as Record<(typeof numberFields)[number], ReturnType<typeof readNumber>>
    const strength = strengthSourceOf(gauge.value, form.manualSource)
    const active = form.readings.flatMap((reading, index) => (reading.excluded ? [] : [{ value: reading.value, index }]))
    // One pass of Dixon's Q over the readings not set aside: a flagged one leaves the result unless kept.
    const flagged = active.length ? summarizeReadings(active.map(reading => reading.value)).outlier : null
    const outlier = flagged && { ...flagged, index: active[flagged.index]!.index, leftOut: !form.readings[active[flagged.index]!.index]!.kept }
    const included = outlier?.leftOut ? active.filter(reading => reading.index !== outlier.index) : active
    const masses = form.byDifference
      ? { doseGross: read.doseGross.value, doseTare: read.doseTare.value, beverageGross: read.beverageGross.value, beverageTare: read.beverageTare.value }
      : { dose: read.dose.value, beverageMass: read.beverageMass.value }
    const input: BrewInput = {
      method: form.method,
      strengthSource: strength.source,
      calibration: strength.calibration,
      brixFactor: strength.usesFactor ? read.brixFactor.value : null,
      readings: included.map(reading => reading.value),
      // An espresso's water is never weighed and its field is hidden: what it held (a recipe's
      // filter water, say) is never used.
      waterMass: form.method === 'espresso' ? null : read.waterMass.value,
      retainedRatio: read.retainedRatio.value,
      ...masses,
    }
    const result = computeBrew(input)
    // A field the result does not use (hidden on the screen) cannot hold up a save.
    const unused = new Set([...(strength.usesFactor ? [] : ['brixFactor']), ...(result.retainedRatio === null ? ['retainedRatio'] : []), ...(form.method === 'espresso' ? ['waterMass'] : [])])
    const invalid: string[] = numberFields.filter(field => read[field].error && !unused.has(field))
    if (readDuration(form.contactTime).error)
      invalid.push('contactTime')
    const temperature = read.waterTemperature.value
    if (temperature !== null && (temperature < 0 || temperature > 100))
      invalid.push('waterTemperature')
    const summary = included.length ? summarizeReadings(input.readings) : null
    const { zone, source: zoneSource } = options.judge(form.context, form.method)
    return {
      input,
      result,
      strength,
      readings: summary && { ...summary, outlier: null },
      outlier,
      uncertainty: brewUncertainty(input, result, { scaleResolution, byDifference: form.byDifference, repeatability: strength.repeatability }),
      verdict: result.tdsPercent !== null && result.yieldPercent !== null && result.tdsPercent > 0 && result.yieldPercent > 0 ? zoneVerdict(zone, { tdsPercent: result.tdsPercent, yieldPercent: result.yieldPercent }) : null,
      ratio: brewRatioOf(result, input.waterMass ?? null),
      zone,
      zoneSource,
      invalid,
    }
  })

  /** Empties the measurement for the next brew; the context, method and instrument stay. */
  function reset(): void {
    const { context, method, instrumentId, manualSource, brixFactor, byDifference } = form
    Object.assign(form, emptyBrewForm(), { context, method, instrumentId, manualSource, brixFactor, byDifference, retainedRatio: lrrText(method) })
  }

  return { form, outcome, gauge, reset }
}

/** The Bench screen provides its form; the parts of the form inject it instead of mutating props. */
export const brewFormKey: InjectionKey<BrewForm> = Symbol('brew form')

export function useInjectedBrewForm(): BrewForm {
  const form = inject(brewFormKey)
  if (!form)
    throw new Error('A brew form part was used outside a measure screen.')
  return form
}
