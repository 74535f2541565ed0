import type { InjectionKey } from 'vue'
import type { BrewMethod, BrewResult, ReadingsSummary, Zone, ZoneVerdict } from '../../shared/brewing'
import { computed, inject, reactive } from 'vue'
import { brewRatio, computeBrew, findZonePreset, summarizeReadings, yieldUncertainty, zonePresets, zoneVerdict } from '../../shared/brewing'

/** What the person types, as typed: numbers stay text until they are read. */
export interface BrewForm {
  method: BrewMethod
  strengthSource: 'direct' | 'brix-factor'
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
  notes: string
  readings: number[]
  zoneId: string
}

export function emptyBrewForm(zoneId = 'us-drip'): BrewForm {
  return {
    method: 'percolation',
    strengthSource: 'direct',
    brixFactor: '0.85',
    byDifference: true,
    dose: '',
    doseGross: '',
    doseTare: '',
    beverageMass: '',
    beverageGross: '',
    beverageTare: '',
    waterMass: '',
    retainedRatio: '',
    grindSetting: '',
    notes: '',
    readings: [],
    zoneId,
  }
}

/** A typed number: blank is null, a comma counts as a decimal point, anything else is an error. */
export function readNumber(text: string): { value: number | null, error: boolean } {
  const trimmed = text.trim().replace(',', '.')
  if (trimmed === '')
    return { value: null, error: false }
  const value = Number(trimmed)
  return Number.isFinite(value) ? { value, error: false } : { value: null, error: true }
}

/** Scale resolution (g) and single-reading repeatability assumed for the ± (common practice). */
const scaleResolution = 0.1
const repeatability = { 'direct': 0.02, 'brix-factor': 0.05 } as const

export interface BrewOutcome {
  result: BrewResult
  readings: ReadingsSummary | null
  uncertainty: { tdsPercent: number, yieldPercent: number } | null
  verdict: ZoneVerdict | null
  ratio: number | null
  zone: Zone
  /** Fields whose text is not a number, by form field name. */
  invalid: string[]
}

export function useBrewForm(initial: BrewForm = emptyBrewForm()) {
  const form = reactive<BrewForm>({ ...initial })

  const outcome = computed<BrewOutcome>(() => {
    const numberFields = ['brixFactor', 'dose', 'doseGross', 'doseTare', 'beverageMass', 'beverageGross', 'beverageTare', 'waterMass', 'retainedRatio'] as const
    const read = Object.fromEntries(numberFields.map(field => [field, readNumber(form[field])])) as Record<(typeof numberFields)[number], { value: number | null, error: boolean }>
    const invalid = numberFields.filter(field => read[field].error)
    const masses = form.byDifference
      ? { doseGross: read.doseGross.value, doseTare: read.doseTare.value, beverageGross: read.beverageGross.value, beverageTare: read.beverageTare.value }
      : { dose: read.dose.value, beverageMass: read.beverageMass.value }
    const result = computeBrew({
      method: form.method,
      strengthSource: form.strengthSource,
      brixFactor: read.brixFactor.value,
      readings: form.readings,
      waterMass: read.waterMass.value,
      retainedRatio: read.retainedRatio.value,
      ...masses,
    })
    const zone = findZonePreset(form.zoneId) ?? zonePresets[0]!
    let uncertainty = null
    if (result.tdsPercent !== null && result.yieldPercent !== null && result.dose !== null) {
      const u = yieldUncertainty({
        method: form.method,
        tdsPercent: result.tdsPercent,
        dose: result.dose,
        beverageMass: result.beverageMass ?? undefined,
        waterMass: read.waterMass.value ?? undefined,
        scaleResolution,
        byDifference: form.byDifference,
        repeatabilityTdsPercent: repeatability[form.strengthSource] * (form.strengthSource === 'brix-factor' ? (read.brixFactor.value ?? 0.85) : 1),
        readings: form.readings.length,
      })
      uncertainty = u.expanded
    }
    // The brew ratio is water per gram of coffee: shown when the water was weighed.
    const water = read.waterMass.value
    return {
      result,
      readings: form.readings.length ? summarizeReadings(form.readings) : null,
      uncertainty,
      verdict: result.tdsPercent !== null && result.yieldPercent !== null && result.tdsPercent > 0 && result.yieldPercent > 0 ? zoneVerdict(zone, { tdsPercent: result.tdsPercent, yieldPercent: result.yieldPercent }) : null,
      ratio: result.dose !== null && water !== null ? brewRatio(result.dose, water) : null,
      zone,
      invalid,
    }
  })

  function reset(zoneId = form.zoneId): void {
    Object.assign(form, emptyBrewForm(zoneId))
  }

  return { form, outcome, reset }
}

/** The Bench screen provides its form; the parts of the form inject it instead of mutating props. */
export const brewFormKey: InjectionKey<BrewForm> = Symbol('brew form')

export function useInjectedBrewForm(): BrewForm {
  const form = inject(brewFormKey)
  if (!form)
    throw new Error('A brew form part was used outside the Bench screen.')
  return form
}
