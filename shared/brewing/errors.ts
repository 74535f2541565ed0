/**
 * The one error every brewing function throws for input it cannot use. `field` names the input
 * (as the forms and API payloads name it); `message` is a sentence for the person at the bar.
 */
export class BrewingInputError extends Error {
  override name = 'BrewingInputError'

  constructor(readonly field: string, message: string) {
    super(message)
  }
}

/** A finite number, or a BrewingInputError naming the field. */
export function requireFinite(value: number, field: string, label: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value))
    throw new BrewingInputError(field, `${label} must be a number.`)
  return value
}

/** A finite number above zero (a dose, a beverage, a slope's denominator). */
export function requirePositive(value: number, field: string, label: string): number {
  requireFinite(value, field, label)
  if (value <= 0)
    throw new BrewingInputError(field, `${label} must be more than zero.`)
  return value
}

/** A finite number of zero or more (a tare, a moisture, a resolution). */
export function requireNonNegative(value: number, field: string, label: string): number {
  requireFinite(value, field, label)
  if (value < 0)
    throw new BrewingInputError(field, `${label} cannot be negative.`)
  return value
}

/** A strength in percent: above zero and below 100 %. */
export function requireTdsPercent(value: number, field = 'tdsPercent'): number {
  requirePositive(value, field, 'Strength (%TDS)')
  if (value >= 100)
    throw new BrewingInputError(field, 'Strength (%TDS) must be below 100 %.')
  return value
}
