import { BrewingInputError, requireFinite, requirePositive } from './errors'

/**
 * Rounds half away from zero at `decimals` places, on the decimal digits a person sees rather than
 * on the binary float: 1.005 → 1.01 and 2.675 → 2.68 (where `toFixed` gives 1.00 and 2.67).
 * @param value - any finite number
 * @param decimals - whole number of decimal places, 0 to 15
 */
export function roundHalfUp(value: number, decimals: number): number {
  requireFinite(value, 'value', 'The value to round')
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > 15)
    throw new BrewingInputError('decimals', 'Decimal places must be a whole number from 0 to 15.')
  if (value === 0)
    return 0
  const rounded = shiftDecimal(Math.round(shiftDecimal(Math.abs(value), decimals)), -decimals)
  return value < 0 ? -rounded : rounded
}

/**
 * value × 10^places on the decimal digits rather than in binary: 36.05 shifted by 1 is exactly
 * 360.5 (36.05 * 10 in floating point is 360.49999999999994). The shortest digits that round-trip a
 * float are the digits the person typed or saw.
 */
function shiftDecimal(value: number, places: number): number {
  const [mantissa, exponent] = value.toExponential().split('e') as [string, string]
  return Number(`${mantissa}e${Number(exponent) + places}`)
}

/** Decimal places implied by a scale's resolution: 0.1 g → 1, 0.01 g → 2, 1 g → 0, 0.05 g → 2. */
export function decimalsForResolution(resolution: number): number {
  requirePositive(resolution, 'resolution', 'The scale resolution')
  const [mantissa, exponent] = resolution.toExponential().split('e') as [string, string]
  const mantissaDecimals = mantissa.split('.')[1]?.length ?? 0
  return Math.max(0, mantissaDecimals - Number(exponent))
}

/** A mass rounded to the nearest step the scale can show (0.1 g, 0.5 g, 0.01 g …). */
export function roundToResolution(mass: number, resolution: number): number {
  requireFinite(mass, 'mass', 'The mass')
  const decimals = decimalsForResolution(resolution)
  // Both as whole numbers of the resolution's last decimal place, so the division is exact.
  const step = Math.round(shiftDecimal(resolution, decimals))
  const scaled = mass === 0 ? 0 : Math.sign(mass) * shiftDecimal(Math.abs(mass), decimals)
  const steps = roundHalfUp(scaled / step, 0)
  return shiftDecimal(steps * step, -decimals)
}

/** Strength for display: two decimals, e.g. `1.35`. */
export const formatTds = (tdsPercent: number): string => roundHalfUp(tdsPercent, 2).toFixed(2)

/** Extraction yield for display: one decimal, e.g. `21.6`. */
export const formatYield = (yieldPercent: number): string => roundHalfUp(yieldPercent, 1).toFixed(1)

/** A mass at the scale's resolution, e.g. `36.4` for 0.1 g or `18.05` for 0.01 g. */
export function formatMass(mass: number, resolution = 0.1): string {
  return roundToResolution(mass, resolution).toFixed(decimalsForResolution(resolution))
}

/** A value at a step (a scale's or an instrument's resolution), e.g. `1.30` at 0.01 or `1.33570` at 0.00001. */
export function formatAtStep(value: number, step: number): string {
  return roundToResolution(value, step).toFixed(decimalsForResolution(step))
}

/**
 * The step of a scale that recorded these masses: the finest step their digits show, and never
 * coarser than 0.1 g, the resolution of a common brew scale (common practice). 8.25 g → 0.01 g,
 * 15 g → 0.1 g, 652.6 g → 0.1 g.
 */
export function scaleStepOf(...masses: (number | null | undefined)[]): number {
  let decimals = 1
  for (const mass of masses) {
    if (typeof mass === 'number' && Number.isFinite(mass) && mass !== 0)
      decimals = Math.max(decimals, Math.min(6, decimalsForResolution(Math.abs(mass))))
  }
  return Number(`1e-${decimals}`)
}
