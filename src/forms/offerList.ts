import type { EntityData } from '../../shared/schemas/entities'
import type { DecimalMark } from './sheetValues'
import Papa from 'papaparse'
import { LotDataSchema } from '../../shared/schemas/entities'
import { readAltitude, readBags, readCurrency, readPriceUnit, readSheetCount, readSheetNumber } from './sheetValues'

// A seller's offer list, from CSV (or a spreadsheet saved as CSV) to lots: read the sheet, match
// its columns to a lot's fields, check every row with the lot schema, and keep the rows that fail
// with their reasons. Nothing here writes: the person sees the preview and confirms first.

/** The lot fields an offer list can fill, in the order the mapping step shows them. */
export const offerFields = [
  { field: 'farm', label: 'Farm or producer', synonyms: ['farm', 'producer', 'farmer', 'grower', 'estate', 'finca', 'fazenda', 'cooperative', 'washing station', 'station'] },
  { field: 'reference', label: 'Seller\'s lot code', synonyms: ['lot number', 'lot no', 'lot code', 'lot id', 'lot ref', 'reference', 'ref', 'code', 'sample', 'lot'] },
  { field: 'region', label: 'Region', synonyms: ['region', 'area', 'province', 'department', 'district', 'origin'] },
  { field: 'altitude', label: 'Altitude (m)', synonyms: ['altitude', 'elevation', 'masl', 'm a s l'] },
  { field: 'variety', label: 'Variety', synonyms: ['variety', 'varietal', 'varieties', 'cultivar'] },
  { field: 'process', label: 'Process', synonyms: ['process', 'processing', 'method'] },
  { field: 'harvest', label: 'Harvest', synonyms: ['harvest', 'crop year', 'crop', 'season'] },
  { field: 'bags', label: 'Bags', synonyms: ['number of bags', 'no of bags', 'bag count', 'bags', 'sacks'] },
  { field: 'bagKg', label: 'Kg per bag', synonyms: ['kg per bag', 'bag weight', 'bag size', 'bag kg', 'sack weight'] },
  { field: 'lotSizeKg', label: 'Lot size (kg)', synonyms: ['lot size', 'total kg', 'net weight', 'weight', 'quantity', 'volume', 'kg'] },
  { field: 'moisturePercent', label: 'Moisture (%)', synonyms: ['moisture', 'humidity', 'h2o'] },
  { field: 'waterActivity', label: 'Water activity (aw)', synonyms: ['water activity', 'aw', 'a w'] },
  { field: 'densityGPerL', label: 'Density (g/L)', synonyms: ['density', 'g l'] },
  { field: 'screenSize', label: 'Screen size', synonyms: ['screen size', 'screen', 'grade size'] },
  { field: 'primaryDefects', label: 'Primary defects', synonyms: ['primary defects', 'primary', 'category 1', 'cat 1'] },
  { field: 'secondaryDefects', label: 'Secondary defects', synonyms: ['secondary defects', 'secondary', 'category 2', 'cat 2'] },
  { field: 'defectSampleG', label: 'Defect sample (g)', synonyms: ['sample weight', 'sample size', 'sample g', 'grams'] },
  { field: 'askingPrice', label: 'Asking price', synonyms: ['asking price', 'offer price', 'price', 'fob', 'cost'] },
  { field: 'currency', label: 'Currency', synonyms: ['currency', 'ccy', 'cur'] },
  { field: 'priceUnit', label: 'Price per', synonyms: ['price unit', 'price per', 'unit', 'per'] },
  { field: 'notes', label: 'Notes', synonyms: ['notes', 'comments', 'remarks', 'description', 'cupping notes'] },
] as const

export type OfferField = (typeof offerFields)[number]['field']
/** Which column (index) fills each field; null leaves the field to its default. */
export type OfferMapping = Record<OfferField, number | null>

export interface OfferSheet {
  headers: string[]
  /** The rows under the header, each with its line in the file (1 is the header). */
  rows: { line: number, cells: string[] }[]
  delimiter: string
  /** The decimal mark the sheet seems to use (a semicolon-separated sheet usually writes commas). */
  decimal: DecimalMark
}

/** Largest offer list read at once: far more lots than any seller offers a buyer in one list. */
export const maxOfferRows = 2000

/** Reads a CSV offer list; throws an Error with a sentence when it is empty or has no header. */
export function readOfferSheet(text: string): OfferSheet {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy' })
  const [header, ...body] = parsed.data
  if (!header || header.every(cell => !cell.trim()))
    throw new Error('The file holds no rows. Save the offer list as CSV with a header row of column names.')
  if (body.length === 0)
    throw new Error('The file has a header row but no lots under it.')
  if (body.length > maxOfferRows)
    throw new Error(`The file holds ${body.length} rows; split it into lists of at most ${maxOfferRows}.`)
  const delimiter = parsed.meta.delimiter
  const commaDecimals = body.some(cells => cells.some(cell => /^\s*-?\d+,\d{1,2}\s*(?:%\s*)?$/.test(cell)))
  // Papa counts lines from 0 and skips blank ones, so a row's line is counted from the raw text.
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/)
  let cursor = lines.findIndex(line => line.trim() !== '')
  const rows = body.map((cells) => {
    cursor += 1
    while (cursor < lines.length && lines[cursor]!.trim() === '')
      cursor += 1
    return { line: cursor + 1, cells: cells.map(cell => cell.trim()) }
  })
  return { headers: header.map(cell => cell.trim()), rows, delimiter, decimal: delimiter !== ',' && commaDecimals ? ',' : '.' }
}

const normal = (text: string): string => ` ${text.normalize('NFD').replace(/[\u0300-\u036F]/g, '').toLowerCase().replace(/[^a-z0-9]+/g, ' ').trim()} `

/**
 * The column each field most likely comes from, by its header: the longest matching name wins, so
 * "Bag weight (kg)" goes to the kg per bag and not to the lot size, and no column fills two fields.
 */
export function guessMapping(headers: readonly string[]): OfferMapping {
  const candidates: { field: OfferField, column: number, strength: number }[] = []
  headers.forEach((header, column) => {
    const text = normal(header)
    for (const { field, synonyms } of offerFields) {
      const strength = Math.max(0, ...synonyms.filter(name => text.includes(` ${name} `)).map(name => name.length + (text.trim() === name ? 100 : 0)))
      if (strength > 0)
        candidates.push({ field, column, strength })
    }
  })
  const mapping = Object.fromEntries(offerFields.map(({ field }) => [field, null])) as OfferMapping
  const taken = new Set<number>()
  for (const candidate of candidates.sort((a, b) => b.strength - a.strength)) {
    if (mapping[candidate.field] === null && !taken.has(candidate.column)) {
      mapping[candidate.field] = candidate.column
      taken.add(candidate.column)
    }
  }
  return mapping
}

export interface OfferProblem { field: string, label: string, message: string }
export interface OfferRow {
  line: number
  /** The lot as it would be saved; null when the row fails. */
  lot: EntityData<'lot'> | null
  problems: OfferProblem[]
}

function labelOf(field: string): string {
  const key = field.startsWith('altitude') ? 'altitude' : field
  return offerFields.find(entry => entry.field === key)?.label ?? (field === 'tripId' ? 'Trip' : field)
}

/** The typed cells of one row as a lot's fields, with the cells that could not be read. */
function fieldsOf(cell: (field: OfferField) => string, decimal: DecimalMark, priceHeader: string): { data: Record<string, unknown>, problems: OfferProblem[] } {
  const data: Record<string, unknown> = {}
  const problems: OfferProblem[] = []
  const fail = (field: OfferField, message: string) => problems.push({ field, label: labelOf(field), message })
  for (const field of ['farm', 'reference', 'region', 'variety', 'process', 'harvest', 'screenSize', 'notes'] as const)
    data[field] = cell(field)
  for (const field of ['lotSizeKg', 'moisturePercent', 'waterActivity', 'densityGPerL', 'defectSampleG', 'askingPrice', 'bagKg'] as const) {
    const read = readSheetNumber(cell(field), decimal)
    if (read.error)
      fail(field, read.error)
    data[field] = read.value
  }
  for (const field of ['primaryDefects', 'secondaryDefects'] as const) {
    const read = readSheetCount(cell(field), decimal)
    if (read.error)
      fail(field, read.error)
    data[field] = read.value
  }
  const altitude = readAltitude(cell('altitude'), decimal)
  if (altitude.error)
    fail('altitude', altitude.error)
  data.altitudeMinM = altitude.value?.min ?? null
  data.altitudeMaxM = altitude.value?.max ?? null
  const bags = readBags(cell('bags'), decimal)
  if (bags.error)
    fail('bags', bags.error)
  data.bags = bags.value?.bags ?? null
  data.bagKg = data.bagKg ?? bags.value?.bagKg ?? null
  if (data.lotSizeKg === null && typeof data.bags === 'number' && typeof data.bagKg === 'number')
    data.lotSizeKg = data.bags * data.bagKg
  const price = cell('askingPrice')
  // A price column headed "Price (USD/lb)" says its currency and unit once for every row.
  data.currency = readCurrency(cell('currency')) ?? readCurrency(price) ?? readCurrency(priceHeader)
  if (cell('currency') && !data.currency)
    fail('currency', `"${cell('currency')}" is not a three-letter currency code`)
  data.priceUnit = readPriceUnit(cell('priceUnit')) ?? readPriceUnit(price) ?? readPriceUnit(priceHeader) ?? 'kg'
  if (cell('priceUnit') && !readPriceUnit(cell('priceUnit')))
    fail('priceUnit', `"${cell('priceUnit')}" is none of kg, lb, bag or lot`)
  return { data, problems }
}

/**
 * Every row of the sheet as a lot of the trip, checked with the lot schema (the server checks the
 * same), or with the reasons it fails, each naming its field. A lot already on the trip, or twice
 * in the file (the same farm and lot code), fails too, so importing a list again adds nothing.
 */
export function offerRows(sheet: OfferSheet, mapping: OfferMapping, options: { tripId: string, decimal: DecimalMark, existing: readonly { farm: string, reference: string }[] }): OfferRow[] {
  const key = (farm: string, reference: string): string => `${normal(farm)}|${normal(reference)}`
  const seen = new Map<string, number>(options.existing.map(lot => [key(lot.farm, lot.reference), 0]))
  return sheet.rows.map(({ line, cells }) => {
    const cell = (field: OfferField): string => {
      const column = mapping[field]
      return column === null ? '' : cells[column] ?? ''
    }
    const priceColumn = mapping.askingPrice
    const { data, problems } = fieldsOf(cell, options.decimal, priceColumn === null ? '' : sheet.headers[priceColumn] ?? '')
    const parsed = LotDataSchema.safeParse({ ...data, tripId: options.tripId })
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const field = String(issue.path[0] ?? 'farm')
        if (!problems.some(problem => problem.field === field || (field.startsWith('altitude') && problem.field === 'altitude')))
          problems.push({ field, label: labelOf(field), message: issue.message })
      }
    }
    const duplicate = seen.get(key(cell('farm'), cell('reference')))
    if (cell('farm') && duplicate !== undefined)
      problems.push({ field: 'farm', label: labelOf('farm'), message: duplicate === 0 ? 'this lot is already on the trip' : `this lot is on line ${duplicate} too` })
    else if (cell('farm'))
      seen.set(key(cell('farm'), cell('reference')), line)
    return { line, lot: problems.length === 0 && parsed.success ? parsed.data : null, problems }
  })
}
