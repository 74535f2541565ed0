import type { RecipeSettings } from '../../shared/schemas/entities'
import { describe, expect, it } from 'vitest'
import { computeBrew } from '../../shared/brewing'
import { brewInputOf } from '../../shared/records/brew-input'
import { plannedRatio, recipeFormOf, settingsFromAttempt, settingsOfForm } from '../../src/forms/recipeForm'
import { changesText } from '../../src/forms/recipeText'
import { localRecord } from './records'

const filter: RecipeSettings = { name: 'Quay filter', method: 'percolation', dose: 15, waterMass: 250, targetTdsPercent: 1.3, targetYieldPercent: 20.5, grindSetting: '22 clicks', contactTimeSeconds: 210, waterTemperatureC: 94, notes: '', beverageMass: 220, retainedRatio: null, timeToleranceSeconds: null, zoneId: null, retired: false }

describe('settingsOfForm', () => {
  it('reads a recipe set by its water, with a decimal comma, and reckons the beverage by mass balance', () => {
    // 250 − 2.0 × 15,5 = 219 g of beverage (LRR 2.0 g/g, common practice for paper filters).
    const { settings, errors } = settingsOfForm({ ...recipeFormOf(filter), dose: '15,5', mass: '250' })
    expect(errors).toEqual({})
    expect(settings).toMatchObject({ dose: 15.5, waterMass: 250, beverageMass: 219 })
  })

  it('keeps an espresso by its beverage and never stores water for it', () => {
    const form = { ...recipeFormOf(null), name: 'Fair espresso', method: 'espresso' as const, dose: '18', setBy: 'water' as const, mass: '36', contactTime: '0:28', timeTolerance: '3' }
    expect(settingsOfForm(form).settings).toMatchObject({ method: 'espresso', dose: 18, beverageMass: 36, waterMass: null, contactTimeSeconds: 28, timeToleranceSeconds: 3 })
  })

  it('names each field it cannot use', () => {
    const { settings, errors } = settingsOfForm({ ...recipeFormOf(filter), name: ' ', dose: 'lots', contactTime: '3 min' })
    expect(settings).toBeNull()
    expect(errors).toEqual({ dose: 'Type a number, such as 18.5.', contactTime: 'Type minutes and seconds, such as 3:45.', name: 'This must not be empty.' })
  })
})

describe('plannedRatio', () => {
  it('words the recipe\'s ratio as beverage per gram of coffee, an estimate when set by the water', () => {
    // 220 g of beverage from 15 g: 14.67.
    expect(plannedRatio(filter)).toEqual({ ratio: 220 / 15, estimated: false })
    expect(plannedRatio({ ...filter, beverageMass: null })).toEqual({ ratio: 220 / 15, estimated: true })
  })
})

describe('settingsFromAttempt', () => {
  it('takes the attempt\'s masses at its scale\'s step, its grind and temperature, and keeps the rest', () => {
    // 27.6 − 12.5 = 15.1 g; 655.0 − 412.6 = 242.4 g; water by mass balance: 242.4 + 2.0 × 15.1 = 272.6 g.
    const brew = localRecord('brew', { method: 'percolation', doseGross: 27.6, doseTare: 12.5, beverageGross: 655, beverageTare: 412.6, waterMass: null, retainedRatio: null, grindSetting: '20 clicks', contactTimeSeconds: 200, waterTemperatureC: 96, strengthSource: 'direct', context: { kind: 'recipe', refId: 'r' }, excludedReadingIds: [] })
    const next = settingsFromAttempt(brew, computeBrew(brewInputOf(brew, [], null)), filter)
    expect(next).toMatchObject({ name: 'Quay filter', dose: 15.1, beverageMass: 242.4, waterMass: 272.6, grindSetting: '20 clicks', contactTimeSeconds: 200, waterTemperatureC: 96, targetTdsPercent: 1.3 })
    expect(changesText(filter, next)).toEqual(['dose 15.0 g → 15.1 g', 'water 250.0 g → 272.6 g', 'beverage 220.0 g → 242.4 g', 'grind 22 clicks → 20 clicks', 'time 3:30 → 3:20', 'temperature 94 °C → 96 °C'])
  })
})
