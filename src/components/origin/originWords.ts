import type { LocalRecord } from '../../db/database'
import { dayOf } from '../../forms/format'

// Words the origin screens share: a trip's dates, a lot's size and altitude, a table's day.

/** A calendar day (YYYY-MM-DD) in the phone's locale: read at noon, so no time zone moves it. */
export const calendarDay = (day: string): string => dayOf(`${day}T12:00:00`)

export function tripDates(trip: Pick<LocalRecord<'trip'>, 'startsOn' | 'endsOn'>): string {
  if (trip.startsOn && trip.endsOn)
    return trip.startsOn === trip.endsOn ? calendarDay(trip.startsOn) : `${calendarDay(trip.startsOn)} – ${calendarDay(trip.endsOn)}`
  return trip.startsOn ? `from ${calendarDay(trip.startsOn)}` : ''
}

export function altitudeText(lot: Pick<LocalRecord<'lot'>, 'altitudeMinM' | 'altitudeMaxM'>): string {
  if (lot.altitudeMinM == null)
    return ''
  return lot.altitudeMaxM == null || lot.altitudeMaxM === lot.altitudeMinM ? `${lot.altitudeMinM} m` : `${lot.altitudeMinM}–${lot.altitudeMaxM} m`
}

export function lotSizeText(lot: Pick<LocalRecord<'lot'>, 'bags' | 'bagKg' | 'lotSizeKg'>): string {
  const bags = lot.bags != null ? `${lot.bags} bags${lot.bagKg != null ? ` × ${lot.bagKg} kg` : ''}` : ''
  const total = lot.lotSizeKg != null ? `${lot.lotSizeKg} kg` : ''
  return [bags, total].filter(Boolean).join(' = ')
}

export function tableTitle(table: Pick<LocalRecord<'cuppingTable'>, 'heldOn' | 'place'>): string {
  return `Table of ${calendarDay(table.heldOn)}${table.place ? ` at ${table.place}` : ''}`
}
