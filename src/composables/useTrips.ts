import type { Ref } from 'vue'
import type { ScoreSheet } from '../../shared/brewing'
import type { LocalRecord } from '../db/database'
import { computed } from 'vue'
import { defaultScoreSheet } from '../../shared/brewing'
import { db } from '../db/database'
import { useLiveQuery } from './useLiveQuery'

const live = <T extends { deletedAt: string | null }>(rows: T[]): T[] => rows.filter(row => !row.deletedAt)

export interface TripSummary { trip: LocalRecord<'trip'>, lots: number, tables: number }

/** The team's buying trips, latest first, with how many lots and cupping tables each holds. */
export function useTrips(teamId: Ref<string | null>) {
  return useLiveQuery(async (): Promise<TripSummary[]> => {
    if (!teamId.value)
      return []
    const [trips, lots, tables] = await Promise.all([db.trips.where('teamId').equals(teamId.value).toArray(), db.lots.where('teamId').equals(teamId.value).toArray(), db.cuppingTables.where('teamId').equals(teamId.value).toArray()])
    return live(trips)
      .sort((a, b) => (b.startsOn ?? b.createdAt).localeCompare(a.startsOn ?? a.createdAt))
      .map(trip => ({ trip, lots: live(lots).filter(lot => lot.tripId === trip.id).length, tables: live(tables).filter(table => table.tripId === trip.id).length }))
  }, [], teamId)
}

/** A team's score sheet as the scoring sums read it. */
export function sheetOfRecord(record: LocalRecord<'scoreSheet'>): ScoreSheet {
  return { id: record.id, name: record.name, attributes: record.attributes, scaleMin: record.scaleMin, scaleMax: record.scaleMax, step: record.step, total: record.total }
}

/** The team's score sheets and the trade's default, and the sheet a table scores on. */
export function useScoreSheets(teamId: Ref<string | null>) {
  const { value: records } = useLiveQuery(async () => (teamId.value ? live(await db.scoreSheets.where('teamId').equals(teamId.value).toArray()).sort((a, b) => a.name.localeCompare(b.name)) : []), [] as LocalRecord<'scoreSheet'>[], teamId)
  const sheets = computed<ScoreSheet[]>(() => [defaultScoreSheet, ...records.value.map(sheetOfRecord)])
  /** A table's sheet: its own choice, else the default (also for a sheet not on this phone). */
  const sheetOf = (table: { scoreSheetId: string | null } | null | undefined): ScoreSheet => sheets.value.find(sheet => sheet.id === table?.scoreSheetId) ?? defaultScoreSheet
  return { records, sheets, sheetOf }
}

export interface TripView {
  trip: LocalRecord<'trip'> | undefined
  lots: LocalRecord<'lot'>[]
  tables: LocalRecord<'cuppingTable'>[]
  bowls: LocalRecord<'brew'>[]
  scores: LocalRecord<'score'>[]
  photos: LocalRecord<'photo'>[]
}

/** A trip with its lots, cupping tables, the lots' bowls and scores, and its photos, as they change. */
export function useTrip(tripId: Ref<string>) {
  return useLiveQuery(async (): Promise<TripView> => {
    const trip = await db.trips.get(tripId.value)
    if (!trip)
      return { trip, lots: [], tables: [], bowls: [], scores: [], photos: [] }
    const [lots, tables] = await Promise.all([db.lots.where('tripId').equals(trip.id).toArray(), db.cuppingTables.where('tripId').equals(trip.id).toArray()])
    const lotIds = new Set(live(lots).map(lot => lot.id))
    const tableIds = live(tables).map(table => table.id)
    const [brews, scores, photos] = await Promise.all([
      db.brews.where('context.refId').anyOf([...lotIds]).filter(brew => !brew.deletedAt && brew.teamId === trip.teamId && brew.context.kind === 'lot').toArray(),
      db.scores.where('tableId').anyOf(tableIds).toArray(),
      db.photos.where('teamId').equals(trip.teamId).filter(photo => !photo.deletedAt && (photo.tripId === trip.id || lotIds.has(photo.lotId ?? ''))).toArray(),
    ])
    return {
      trip,
      lots: live(lots).sort((a, b) => a.farm.localeCompare(b.farm)),
      tables: live(tables).sort((a, b) => b.heldOn.localeCompare(a.heldOn)),
      bowls: brews.sort((a, b) => a.brewedAt.localeCompare(b.brewedAt)),
      scores: live(scores),
      photos: photos.sort((a, b) => a.takenAt.localeCompare(b.takenAt)),
    }
  }, { trip: undefined, lots: [], tables: [], bowls: [], scores: [], photos: [] }, tripId)
}
