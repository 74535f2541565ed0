import type { RecipeSettings } from '../../shared/schemas/entities'
import { formatTds, formatYield, ratioText } from '../../shared/brewing'
import { grams } from './format'
import { formatDuration } from './numbers'
import { plannedRatio } from './recipeForm'

// A recipe's settings in words, the same on every recipe and dial-in screen.

/** "15.0 g in 250.0 g of water (about 220.0 g of beverage)", "18.0 g → 36.0 g in 0:28 ± 3 s". */
export function massesText(s: RecipeSettings): string {
  if (s.method === 'espresso') {
    const time = s.contactTimeSeconds !== null ? ` in ${formatDuration(s.contactTimeSeconds)}${s.timeToleranceSeconds ? ` ± ${s.timeToleranceSeconds} s` : ''}` : ''
    return `${grams(s.dose)} → ${grams(s.beverageMass)}${time}`
  }
  const beverage = s.beverageMass !== null ? ` (${s.method === 'immersion' ? 'about ' : ''}${grams(s.beverageMass)} ${s.method === 'immersion' ? 'poured off' : 'of beverage'})` : ''
  return `${grams(s.dose)} in ${grams(s.waterMass)} of water${beverage}`
}

/** The recipe's brew ratio in the one wording, or ''. */
export function recipeRatioText(s: RecipeSettings): string {
  const ratio = plannedRatio(s)
  return ratio ? `Brew ratio ${ratioText(ratio)}` : ''
}

/** "1.30 %TDS at 20.5 % EY", or '' without a target. */
export function targetText(s: Pick<RecipeSettings, 'targetTdsPercent' | 'targetYieldPercent'>): string {
  const parts = [s.targetTdsPercent !== null ? `${formatTds(s.targetTdsPercent)} %TDS` : '', s.targetYieldPercent !== null ? `${formatYield(s.targetYieldPercent)} % EY` : '']
  return parts.filter(Boolean).join(' at ')
}

const describe: { [K in keyof RecipeSettings]?: [string, (value: RecipeSettings[K]) => string] } = {
  name: ['name', value => `“${value}”`],
  dose: ['dose', value => grams(value)],
  waterMass: ['water', value => grams(value)],
  beverageMass: ['beverage', value => grams(value)],
  grindSetting: ['grind', value => value || '—'],
  contactTimeSeconds: ['time', value => formatDuration(value) || '—'],
  timeToleranceSeconds: ['time tolerance', value => (value === null ? '—' : `± ${value} s`)],
  waterTemperatureC: ['temperature', value => (value === null ? '—' : `${value} °C`)],
  targetTdsPercent: ['target strength', value => (value === null ? '—' : `${formatTds(value)} %TDS`)],
  targetYieldPercent: ['target extraction', value => (value === null ? '—' : `${formatYield(value)} %`)],
  retainedRatio: ['LRR', value => (value === null ? 'common practice' : `${value} g/g`)],
  zoneId: ['zone', value => value ?? 'the team\'s default'],
  notes: ['notes', value => value || '—'],
  retired: ['retired', value => (value ? 'yes' : 'no')],
}

/** What a version changed from the one before, in words: "grind 24 clicks → 22 clicks". */
export function changesText(before: RecipeSettings | undefined, after: RecipeSettings, zoneName: (id: string) => string = id => id): string[] {
  if (!before)
    return []
  const lines: string[] = []
  for (const key of Object.keys(describe) as (keyof RecipeSettings)[]) {
    if (JSON.stringify(before[key]) === JSON.stringify(after[key]))
      continue
    const [label, show] = describe[key] as [string, (value: unknown) => string]
    const word = (value: unknown): string => (key === 'zoneId' && typeof value === 'string' ? zoneName(value) : show(value))
    lines.push(`${label} ${word(before[key])} → ${word(after[key])}`)
  }
  return lines
}
