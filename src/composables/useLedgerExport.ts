import type { Ref } from 'vue'
import type { Zone } from '../../shared/brewing'
import type { LocalRecord } from '../db/database'
import type { LedgerExportContext } from '../forms/ledgerExport'
import type { BrewContexts } from './useBrewContexts'
import { db } from '../db/database'
import { ledgerRows, readingRows } from '../forms/ledgerExport'

type Brew = LocalRecord<'brew'>

/** Hands a CSV to the browser to save; works offline. The CSV writer loads with the first export. */
async function download(rows: Record<string, string | number>[], name: string): Promise<void> {
  const { default: Papa } = await import('papaparse')
  const link = document.createElement('a')
  link.href = URL.createObjectURL(new Blob([Papa.unparse(rows)], { type: 'text/csv;charset=utf-8' }))
  link.download = `lixivia-${name}-${new Date().toISOString().slice(0, 10)}.csv`
  link.click()
  URL.revokeObjectURL(link.href)
}

/**
 * The Ledger's exports: the brews as listed, and one file of their readings. Readings, instruments
 * and calibrations are read from the phone only when a file is asked for.
 */
export function useLedgerExport(teamId: Ref<string | null>, contexts: BrewContexts, nameOf: (userId: string) => string) {
  async function contextFor(brews: Brew[]): Promise<LedgerExportContext> {
    const team = teamId.value ?? ''
    const [readings, instruments, calibrations] = await Promise.all([
      db.readings.where('brewId').anyOf(brews.map(brew => brew.id)).toArray(),
      db.instruments.where('teamId').equals(team).toArray(),
      db.calibrations.where('teamId').equals(team).toArray(),
    ])
    const byBrew = new Map<string, LocalRecord<'reading'>[]>()
    for (const reading of readings.sort((a, b) => a.takenAt.localeCompare(b.takenAt) || a.id.localeCompare(b.id)))
      byBrew.set(reading.brewId, [...(byBrew.get(reading.brewId) ?? []), reading])
    const instrumentsById = new Map(instruments.map(row => [row.id, row]))
    const calibrationsById = new Map(calibrations.map(row => [row.id, row]))
    return {
      zoneFor: (brew: Brew): Zone => contexts.zoneOf(brew.context, brew.method).zone,
      nameOf,
      labelOf: brew => contexts.labelOf(brew.context),
      readingsOf: id => byBrew.get(id) ?? [],
      instrumentOf: id => instrumentsById.get(id),
      calibrationOf: id => calibrationsById.get(id),
    }
  }
  return {
    exportBrews: async (brews: Brew[]): Promise<void> => download(ledgerRows(brews, await contextFor(brews)), 'ledger'),
    exportReadings: async (brews: Brew[]): Promise<void> => download(readingRows(brews, await contextFor(brews)), 'readings'),
  }
}
