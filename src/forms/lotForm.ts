import type { EntityData } from '../../shared/schemas/entities'
import type { PriceUnit } from '../../shared/schemas/origin'
import type { LocalRecord } from '../db/database'
import { LotDataSchema } from '../../shared/schemas/entities'
import { numberText, readNumber } from './numbers'

// The lot form as typed (numbers stay text, a decimal comma is accepted) and back to a lot's fields.

export const lotTextFields = ['farm', 'reference', 'region', 'variety', 'process', 'harvest', 'screenSize', 'currency', 'notes'] as const
export const lotNumberFields = ['altitudeMinM', 'altitudeMaxM', 'bags', 'bagKg', 'lotSizeKg', 'moisturePercent', 'waterActivity', 'densityGPerL', 'primaryDefects', 'secondaryDefects', 'defectSampleG', 'askingPrice'] as const
type TextField = (typeof lotTextFields)[number]
type NumberField = (typeof lotNumberFields)[number]
export type LotForm = Record<TextField | NumberField, string> & { priceUnit: PriceUnit }
export type LotFormField = keyof LotForm

/** What each field is called on screen, for its label and its errors. */
export const lotLabels: Record<LotFormField, string> = {
  farm: 'Farm or producer',
  reference: 'Seller\'s lot code',
  region: 'Region',
  variety: 'Variety',
  process: 'Process',
  harvest: 'Harvest',
  screenSize: 'Screen size',
  currency: 'Currency',
  notes: 'Notes',
  altitudeMinM: 'Altitude from (m)',
  altitudeMaxM: 'Altitude to (m)',
  bags: 'Bags',
  bagKg: 'Kg per bag',
  lotSizeKg: 'Lot size (kg)',
  moisturePercent: 'Moisture (%)',
  waterActivity: 'Water activity (aw)',
  densityGPerL: 'Density (g/L)',
  primaryDefects: 'Primary defects',
  secondaryDefects: 'Secondary defects',
  defectSampleG: 'Sample weighed (g)',
  askingPrice: 'Asking price',
  priceUnit: 'Price per',
}

/** A green-grading sample of 350 g, the size SCA green grading counts defects in (from memory). */
export const defaultDefectSampleG = 350

export function lotFormOf(lot?: Partial<EntityData<'lot'>> | LocalRecord<'lot'> | null): LotForm {
  const text = Object.fromEntries(lotTextFields.map(field => [field, String(lot?.[field] ?? '')]))
  const numbers = Object.fromEntries(lotNumberFields.map(field => [field, numberText(lot?.[field])]))
  return { ...text, ...numbers, defectSampleG: lot ? numberText(lot.defectSampleG) : String(defaultDefectSampleG), priceUnit: lot?.priceUnit ?? 'kg' } as LotForm
}

/**
 * The lot's fields from the form, checked with the lot schema (the server checks the same), or the
 * errors beside each field, worded with its label. Bags times kilograms fills a blank lot size.
 */
export function lotDataOf(form: LotForm, tripId: string | null): { data: Omit<EntityData<'lot'>, 'decision' | 'decisionReason'> | null, errors: Partial<Record<LotFormField, string>> } {
  const errors: Partial<Record<LotFormField, string>> = {}
  const numbers: Partial<Record<NumberField, number | null>> = {}
  for (const field of lotNumberFields) {
    const read = readNumber(form[field])
    if (read.error)
      errors[field] = `${lotLabels[field]} must be a number.`
    numbers[field] = read.value
  }
  if (numbers.lotSizeKg == null && numbers.bags != null && numbers.bagKg != null)
    numbers.lotSizeKg = numbers.bags * numbers.bagKg
  const texts = Object.fromEntries(lotTextFields.map(field => [field, form[field].trim()]))
  const parsed = LotDataSchema.safeParse({ ...texts, ...numbers, currency: texts.currency ? texts.currency.toUpperCase() : null, priceUnit: form.priceUnit, tripId })
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const field = String(issue.path[0]) as LotFormField
      if (field in lotLabels && !errors[field])
        errors[field] = `${lotLabels[field]} ${issue.message}.`
    }
  }
  if (Object.keys(errors).length || !parsed.success)
    return { data: null, errors }
  const { decision: _decision, decisionReason: _reason, ...data } = parsed.data
  return { data, errors }
}
