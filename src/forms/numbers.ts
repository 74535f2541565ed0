/** A typed number: blank is null, a comma counts as a decimal point, anything else is an error. */
export function readNumber(text: string): { value: number | null, error: boolean } {
  const trimmed = text.trim().replace(',', '.')
  if (trimmed === '')
    return { value: null, error: false }
  const value = Number(trimmed)
  return Number.isFinite(value) ? { value, error: false } : { value: null, error: true }
}

/** A typed duration in seconds: "3:45" (minutes and seconds) or plain seconds ("225"). */
export function readDuration(text: string): { value: number | null, error: boolean } {
  const trimmed = text.trim()
  if (trimmed === '')
    return { value: null, error: false }
  const match = /^(\d{1,4}):([0-5]\d)$/.exec(trimmed)
  if (match)
    return { value: Number(match[1]) * 60 + Number(match[2]), error: false }
  const plain = readNumber(trimmed)
  return plain.value !== null && plain.value >= 0 ? plain : { value: null, error: true }
}

/** Seconds as "m:ss" for a duration field. */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds == null)
    return ''
  const whole = Math.round(seconds)
  return `${Math.floor(whole / 60)}:${String(whole % 60).padStart(2, '0')}`
}

/** A number for a text field: blank for none. */
export const numberText = (value: unknown): string => (typeof value === 'number' ? String(value) : '')
