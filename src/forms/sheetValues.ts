import type { PriceUnit } from '../../shared/schemas/origin'

// Cells of a seller's offer list as people type them into a spreadsheet: units beside the number,
// thousands grouped, a decimal comma in much of the world, ranges and "20 x 69 kg" bag counts.

export type DecimalMark = '.' | ','
export interface CellValue<T> { value: T | null, error: string | null }

function ok<T>(value: T | null): CellValue<T> {
  return { value, error: null }
}
const bad = <T>(error: string): CellValue<T> => ({ value: null, error })

/**
 * A number from a cell, with its unit or currency around it left aside ("10.8 %", "USD 4.20",
 * "1,600 masl"). Grouping marks must group thousands: with a decimal point, "10,8" is refused
 * rather than read as 108.
 * @param text - the cell as typed
 * @param decimal - the decimal mark the sheet uses
 */
export function readSheetNumber(text: string, decimal: DecimalMark): CellValue<number> {
  const trimmed = text.trim()
  const core = trimmed.replace(/[\s']/g, '').replace(/^[^\d+\-.,]+/, '').replace(/[^\d.,]+$/, '')
  if (trimmed === '')
    return { value: null, error: null }
  if (core === '')
    return bad(`"${trimmed}" is not a number`)
  const group = decimal === '.' ? ',' : '.'
  const digits = `\\d{1,3}(?:\\${group}\\d{3})+`
  const grouped = new RegExp(`^-?(?:${digits}|\\d+)(?:\\${decimal}\\d+)?$`)
  if (!grouped.test(core))
    return bad(`"${trimmed}" is not a number with "${decimal}" as the decimal mark`)
  const value = Number(core.split(group).join('').replace(decimal, '.'))
  return Number.isFinite(value) ? ok(value) : bad(`"${trimmed}" is not a number`)
}

/** A whole number from a cell ("20 bags"). */
export function readSheetCount(text: string, decimal: DecimalMark): CellValue<number> {
  const read = readSheetNumber(text, decimal)
  return read.value !== null && !Number.isInteger(read.value) ? bad(`"${text.trim()}" is not a whole number`) : read
}

/** An altitude or a range of them in metres: "1600", "1,600–1,800 masl", "5200 ft" (feet converted, 0.3048 m each). */
export function readAltitude(text: string, decimal: DecimalMark): CellValue<{ min: number, max: number | null }> {
  const trimmed = text.trim()
  if (trimmed === '')
    return { value: null, error: null }
  const feet = /\b(?:ft|feet)\b/i.test(trimmed)
  const parts = trimmed.replace(/\b(?:m\.?a\.?s\.?l\.?|metres?|meters?|ft|feet|m)\b\.?/gi, '').split(/\s*(?:[–—\-]|\bto\b)\s*/i).filter(Boolean)
  if (parts.length === 0 || parts.length > 2)
    return bad(`"${trimmed}" is not an altitude or a range of altitudes`)
  const read = parts.map(part => readSheetNumber(part, decimal))
  const failed = read.find(part => part.error)
  if (failed)
    return bad(failed.error!)
  const metres = read.map(part => Math.round(feet ? part.value! * 0.3048 : part.value!))
  return ok({ min: metres[0]!, max: metres[1] ?? null })
}

/** A bag count, with the bag's weight when the cell gives it: "20", "20 x 69 kg", "275 × 60kg". */
export function readBags(text: string, decimal: DecimalMark): CellValue<{ bags: number, bagKg: number | null }> {
  const trimmed = text.trim()
  const match = /^(\d[\d.,]*)\s*(?:bags?\s*)?(?:[x×*@]|of)\s*(\d[\d.,]*)\s*kg\b/i.exec(trimmed)
  if (match) {
    const bags = readSheetCount(match[1]!, decimal)
    const kg = readSheetNumber(match[2]!, decimal)
    return bags.error || kg.error ? bad((bags.error ?? kg.error)!) : ok({ bags: bags.value!, bagKg: kg.value })
  }
  const bags = readSheetCount(trimmed, decimal)
  return bags.error ? bad(bags.error) : ok(bags.value === null ? null : { bags: bags.value, bagKg: null })
}

const symbols: Record<string, string> = { '$': 'USD', '€': 'EUR', '£': 'GBP', '¥': 'JPY' }

/** A currency code from its own cell or from a price ("USD 4.20", "€7.40"): three capital letters. */
export function readCurrency(text: string): string | null {
  const code = /\b([A-Z]{3})\b/i.exec(text)?.[1]
  if (code && !/^(?:KGS?|LBS?|BAG|LOT|PER)$/i.test(code))
    return code.toUpperCase()
  const symbol = Object.keys(symbols).find(mark => text.includes(mark))
  return symbol ? symbols[symbol]! : null
}

/** What a price is per, from its own cell ("lb", "per bag") or from the price ("4.20/lb"). */
export function readPriceUnit(text: string): PriceUnit | null {
  const unit = /(?:^|\/|\bper\s+|\s)(kg|kilo(?:gram)?s?|lbs?|pounds?|bags?|sacks?|lots?)\b/i.exec(text.trim())?.[1]?.toLowerCase()
  if (!unit)
    return null
  if (unit.startsWith('k'))
    return 'kg'
  if (unit.startsWith('l') && unit !== 'lot' && unit !== 'lots')
    return 'lb'
  if (unit.startsWith('p'))
    return 'lb'
  return unit.startsWith('b') || unit.startsWith('s') ? 'bag' : 'lot'
}
