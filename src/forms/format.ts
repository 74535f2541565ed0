import type { ReadingKind } from '../../shared/brewing'
import { formatAtStep, formatMass, readingRanges, scaleStepOf } from '../../shared/brewing'

// How numbers and dates look on every screen and in every export, in one place: masses at the
// scale's step, readings at the instrument's, half-up (shared/brewing/rounding.ts); dates and times
// in the phone's locale and time zone, without seconds.

/** A mass in grams at the step its scale shows (from the masses recorded with it), or a dash. */
export function grams(mass: number | null | undefined, ...recordedWith: (number | null | undefined)[]): string {
  return typeof mass === 'number' ? `${formatMass(mass, scaleStepOf(mass, ...recordedWith))} g` : '—'
}

/** A reading at its instrument's resolution, or at the usual step of its unit without one. */
export function readingText(value: number, kind: ReadingKind, resolution?: number | null): string {
  return formatAtStep(value, resolution ?? readingRanges[kind].step)
}

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' })
const timeOnly = new Intl.DateTimeFormat(undefined, { timeStyle: 'short' })
const dayOnly = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' })

/** A moment as the phone's locale writes it: "2 Dec 2026, 07:41". */
export const when = (iso: string): string => dateTime.format(new Date(iso))
/** The time of day only: "07:41". */
export const timeOf = (iso: string): string => timeOnly.format(new Date(iso))
/** The day only: "2 Dec 2026". */
export const dayOf = (iso: string): string => dayOnly.format(new Date(iso))

const whole = new Intl.NumberFormat(undefined, { maximumFractionDigits: 0 })
/** A count as the phone's locale groups it: "12,000". */
export const countText = (n: number): string => whole.format(n)
