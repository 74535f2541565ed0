import type { Zone } from '../../shared/brewing'
import type { LocalRecord } from '../db/database'
import { brewRatioOf, computeBrew, formatTds, formatYield, roundHalfUp, zoneVerdict } from '../../shared/brewing'
import { brewInputOf, lineOf } from '../../shared/records/brew-input'
import { kindUnits } from '../composables/useGauges'
import { readingText } from './format'

type Brew = LocalRecord<'brew'>

/** What an export needs besides the brews: their context and zone, people's names, readings, instruments. */
export interface LedgerExportContext {
  zoneFor: (brew: Brew) => Zone
  nameOf?: (userId: string) => string
  labelOf?: (brew: Brew) => string
  readingsOf?: (brewId: string) => LocalRecord<'reading'>[]
  instrumentOf?: (id: string) => LocalRecord<'instrument'> | undefined
  calibrationOf?: (id: string) => LocalRecord<'calibration'> | undefined
}

const number = (value: number | null): number | string => value ?? ''
// Net masses as the core computes them (gross minus tare where weighed so), to 2 decimals.
const grams = (value: number | null): number | string => (value === null ? '' : roundHalfUp(value, 2))
const kinds: Record<Brew['context']['kind'], string> = { quick: 'quick brew', entry: 'event cup', lot: 'lot', recipe: 'recipe' }

/**
 * The rows of the brews CSV, with units in the headers: every input as recorded (gross and tare
 * too), the result, the zone that judged it, the instrument and calibration, and the readings, so a
 * dispute can be settled from the file alone.
 */
export function ledgerRows(brews: Brew[], context: LedgerExportContext): Record<string, string | number>[] {
  return brews.map((brew) => {
    const result = computeBrew(brewInputOf(brew, [], null))
    const tds = brew.derived?.tdsPercent ?? null
    const ey = brew.derived?.yieldPercent ?? null
    // The one brew ratio (shared/brewing/ratio.ts), with the brew's own strength for a full immersion.
    const ratio = brewRatioOf({ ...result, tdsPercent: tds }, brew.method === 'espresso' ? null : brew.waterMass)
    const zone = context.zoneFor(brew)
    const inside = tds !== null && ey !== null && tds > 0 && ey > 0 ? zoneVerdict(zone, { tdsPercent: tds, yieldPercent: ey }).inZone : null
    const instrument = brew.instrumentId ? context.instrumentOf?.(brew.instrumentId) : undefined
    const calibration = brew.calibrationId ? context.calibrationOf?.(brew.calibrationId) : undefined
    const fit = lineOf(calibration)
    const readings = context.readingsOf?.(brew.id) ?? []
    const aside = new Set(brew.excludedReadingIds)
    const value = (reading: LocalRecord<'reading'>): string => readingText(reading.value, reading.kind, instrument?.resolution)
    return {
      'brew id': brew.id,
      'brewed at (ISO 8601)': brew.brewedAt,
      'method': brew.method,
      'context': context.labelOf?.(brew) ?? kinds[brew.context.kind],
      'TDS (%)': tds === null ? '' : formatTds(tds),
      'extraction yield (%)': ey === null ? '' : formatYield(ey),
      'dose (g)': grams(result.dose),
      'dose gross (g)': number(brew.doseGross),
      'dose tare (g)': number(brew.doseTare),
      'beverage (g)': grams(result.beverageEstimated ? null : result.beverageMass),
      'beverage gross (g)': number(brew.beverageGross),
      'beverage tare (g)': number(brew.beverageTare),
      'water (g)': number(brew.waterMass),
      'LRR (g/g)': number(brew.retainedRatio),
      'brew ratio (g of beverage per g of coffee)': ratio ? roundHalfUp(ratio.ratio, 1) : '',
      'readings': readings.filter(r => !aside.has(r.id)).map(value).join('; '),
      'readings set aside': readings.filter(r => aside.has(r.id)).map(value).join('; '),
      'reading unit': readings[0] ? kindUnits[readings[0].kind] : '',
      'strength from': brew.strengthSource,
      '°Brix factor': number(brew.brixFactor),
      'instrument': instrument?.label ?? '',
      'calibration fitted at (ISO 8601)': calibration?.calibratedAt ?? '',
      'calibration slope': fit ? fit.slope : '',
      'calibration intercept': fit ? fit.intercept : '',
      'what changed since the attempt before': brew.changeNote,
      'grind setting': brew.grindSetting,
      'contact time (s)': number(brew.contactTimeSeconds),
      'water temperature (°C)': number(brew.waterTemperatureC),
      'zone': zone.name,
      'in zone': inside === null ? '' : inside ? 'yes' : 'no',
      'recorded by': context.nameOf?.(brew.createdBy) ?? '',
      'notes': brew.notes,
      'synced': brew.sync.state === 'clean' ? 'yes' : 'no',
    }
  })
}

/** The rows of the readings CSV: one per reading of the brews, with the brew it belongs to. */
export function readingRows(brews: Brew[], context: LedgerExportContext): Record<string, string | number>[] {
  return brews.flatMap((brew) => {
    const aside = new Set(brew.excludedReadingIds)
    const instrument = brew.instrumentId ? context.instrumentOf?.(brew.instrumentId) : undefined
    return (context.readingsOf?.(brew.id) ?? []).map((reading, index) => ({
      'brew id': brew.id,
      'brewed at (ISO 8601)': brew.brewedAt,
      'context': context.labelOf?.(brew) ?? kinds[brew.context.kind],
      'reading': index + 1,
      'value': readingText(reading.value, reading.kind, instrument?.resolution),
      'unit': kindUnits[reading.kind],
      'set aside': aside.has(reading.id) ? 'yes' : 'no',
      'taken at (ISO 8601)': reading.takenAt,
      'instrument': instrument?.label ?? '',
      'recorded by': context.nameOf?.(reading.createdBy) ?? '',
    }))
  })
}
