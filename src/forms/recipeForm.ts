import type { BrewRatio, BrewResult } from '../../shared/brewing'
import type { EntityData, RecipeSettings } from '../../shared/schemas/entities'
import { brewRatioOf, defaultRetainedRatio, roundToResolution, scaleStepOf } from '../../shared/brewing'
import { RecipeSettingsSchema } from '../../shared/schemas/entities'
import { formatDuration, numberText, readDuration, readNumber } from './numbers'

/** A recipe as typed on its form: numbers stay text until they are read. */
export interface RecipeForm {
  name: string
  method: RecipeSettings['method']
  dose: string
  /** What the one mass typed is: the water to pour, or the beverage aimed at (always for espresso). */
  setBy: 'water' | 'beverage'
  mass: string
  retainedRatio: string
  grindSetting: string
  contactTime: string
  timeTolerance: string
  waterTemperature: string
  targetTds: string
  targetYield: string
  zoneId: string | null
  notes: string
}

export const lrrOf = (settings: Pick<RecipeSettings, 'method' | 'retainedRatio'>): number => settings.retainedRatio ?? defaultRetainedRatio[settings.method === 'immersion' ? 'immersion' : 'percolation']

export function recipeFormOf(settings: RecipeSettings | null): RecipeForm {
  const s = settings
  const setBy = s && (s.method === 'espresso' || s.waterMass === null) ? 'beverage' : 'water'
  return {
    name: s?.name ?? '',
    method: s?.method ?? 'percolation',
    dose: numberText(s?.dose),
    setBy,
    mass: numberText(setBy === 'water' ? s?.waterMass : s?.beverageMass),
    retainedRatio: numberText(s?.retainedRatio),
    grindSetting: s?.grindSetting ?? '',
    contactTime: formatDuration(s?.contactTimeSeconds),
    timeTolerance: numberText(s?.timeToleranceSeconds),
    waterTemperature: numberText(s?.waterTemperatureC),
    targetTds: numberText(s?.targetTdsPercent),
    targetYield: numberText(s?.targetYieldPercent),
    zoneId: s?.zoneId ?? null,
    notes: s?.notes ?? '',
  }
}

/** The water and the beverage of a recipe from the one mass typed: water = beverage + LRR × dose (mass balance). */
function massesOf(method: RecipeSettings['method'], setBy: RecipeForm['setBy'], mass: number | null, dose: number | null, lrr: number): Pick<RecipeSettings, 'waterMass' | 'beverageMass'> {
  if (method === 'espresso')
    return { waterMass: null, beverageMass: mass }
  if (mass === null || dose === null)
    return setBy === 'water' ? { waterMass: mass, beverageMass: null } : { waterMass: null, beverageMass: mass }
  const round = (grams: number): number => roundToResolution(grams, scaleStepOf(mass, dose))
  return setBy === 'water' ? { waterMass: mass, beverageMass: round(mass - lrr * dose) } : { waterMass: round(mass + lrr * dose), beverageMass: mass }
}

const fieldOfKey: Record<string, keyof RecipeForm> = { dose: 'dose', waterMass: 'mass', beverageMass: 'mass', retainedRatio: 'retainedRatio', contactTimeSeconds: 'contactTime', timeToleranceSeconds: 'timeTolerance', waterTemperatureC: 'waterTemperature', targetTdsPercent: 'targetTds', targetYieldPercent: 'targetYield', name: 'name', grindSetting: 'grindSetting', notes: 'notes' }

/**
 * The recipe's settings from its form, checked with the recipe schema; or the errors beside each
 * field. `retired` is kept from the version it changes.
 */
export function settingsOfForm(form: RecipeForm, retired = false): { settings: RecipeSettings | null, errors: Partial<Record<keyof RecipeForm, string>> } {
  const errors: Partial<Record<keyof RecipeForm, string>> = {}
  const number = (field: keyof RecipeForm): number | null => {
    const read = readNumber(String(form[field]))
    if (read.error)
      errors[field] = 'Type a number, such as 18.5.'
    return read.value
  }
  const dose = number('dose')
  const lrrTyped = form.method === 'espresso' ? null : number('retainedRatio')
  const time = readDuration(form.contactTime)
  if (time.error)
    errors.contactTime = 'Type minutes and seconds, such as 3:45.'
  const candidate = {
    name: form.name,
    method: form.method,
    dose,
    ...massesOf(form.method, form.setBy, number('mass'), dose, lrrTyped ?? lrrOf({ method: form.method, retainedRatio: null })),
    targetTdsPercent: number('targetTds'),
    targetYieldPercent: number('targetYield'),
    grindSetting: form.grindSetting,
    contactTimeSeconds: time.value,
    waterTemperatureC: number('waterTemperature'),
    notes: form.notes,
    retainedRatio: lrrTyped,
    timeToleranceSeconds: form.method === 'espresso' ? number('timeTolerance') : null,
    zoneId: form.zoneId,
    retired,
  }
  const parsed = RecipeSettingsSchema.safeParse(candidate)
  for (const issue of parsed.error?.issues ?? []) {
    const field = fieldOfKey[String(issue.path[0])] ?? 'name'
    errors[field] ??= issue.code === 'invalid_type' ? 'Fill this in.' : `This ${issue.message}.`
  }
  return Object.keys(errors).length || !parsed.success ? { settings: null, errors } : { settings: parsed.data, errors }
}

/** A recipe's brew ratio (grams of beverage per gram of coffee) as planned, the way a brew of it would be measured. */
export function plannedRatio(settings: RecipeSettings): BrewRatio | null {
  const lrr = lrrOf(settings)
  const immersion = settings.method === 'immersion'
  const beverageMass = settings.beverageMass ?? (settings.waterMass !== null ? settings.waterMass - lrr * settings.dose : null)
  const result: Pick<BrewResult, 'dose' | 'beverageMass' | 'beverageEstimated' | 'yieldBasis' | 'retainedRatio' | 'tdsPercent'> = {
    dose: settings.dose,
    beverageMass,
    beverageEstimated: settings.beverageMass === null,
    yieldBasis: immersion ? (settings.waterMass !== null ? 'immersion-water' : 'immersion-decanted') : 'beverage',
    retainedRatio: lrr,
    tdsPercent: settings.targetTdsPercent,
  }
  return brewRatioOf(result, settings.waterMass)
}

/**
 * The next version's settings from a dial-in attempt: its dose, beverage, water, grind, time and
 * temperature, the rest (name, targets, zone, notes) kept from the recipe. The masses are those
 * the result used, at the step of the scale that weighed them; a percolation's water, when it was
 * not weighed, is the beverage plus what the grounds keep (LRR × dose).
 */
export function settingsFromAttempt(brew: EntityData<'brew'>, result: Pick<BrewResult, 'dose' | 'beverageMass' | 'retainedRatio'>, base: RecipeSettings): RecipeSettings {
  const step = scaleStepOf(brew.dose, brew.doseGross, brew.doseTare, brew.beverageMass, brew.beverageGross, brew.beverageTare, brew.waterMass)
  const round = (grams: number): number => roundToResolution(grams, step)
  const dose = round(result.dose ?? base.dose)
  const lrr = result.retainedRatio ?? lrrOf(base)
  const beverage = result.beverageMass !== null ? round(result.beverageMass) : null
  let masses: Pick<RecipeSettings, 'waterMass' | 'beverageMass'>
  if (base.method === 'espresso')
    masses = { waterMass: null, beverageMass: beverage ?? base.beverageMass }
  else if (brew.waterMass != null)
    masses = { waterMass: brew.waterMass, beverageMass: base.method === 'immersion' ? round(brew.waterMass - lrr * dose) : beverage }
  else
    masses = { waterMass: beverage !== null ? round(beverage + lrr * dose) : base.waterMass, beverageMass: beverage }
  return {
    ...base,
    dose,
    ...masses,
    retainedRatio: result.retainedRatio ?? base.retainedRatio,
    grindSetting: brew.grindSetting || base.grindSetting,
    contactTimeSeconds: brew.contactTimeSeconds ?? base.contactTimeSeconds,
    waterTemperatureC: brew.waterTemperatureC ?? base.waterTemperatureC,
    retired: false,
  }
}

/** A recipe's settings without the record's envelope or its current-version pointer. */
export function settingsOf(recipe: EntityData<'recipe'>): RecipeSettings {
  const { versionId: _version, ...rest } = recipe
  return RecipeSettingsSchema.parse(Object.fromEntries(Object.keys(RecipeSettingsSchema.shape).map(key => [key, rest[key as keyof typeof rest]])))
}
