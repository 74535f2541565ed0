import type { BowlsSummary, ScoreSheet } from '../../shared/brewing'
import type { LotDecision, PriceUnit } from '../../shared/schemas/origin'
import type { LocalRecord } from '../db/database'
import { formatTds, formatYield, lotScores, roundHalfUp, summarizeBowls } from '../../shared/brewing'

/** The team's words for a decision on a lot, and what each means. */
export const decisionWords: Record<LotDecision, { label: string, hint: string, color: string }> = {
  open: { label: 'Open', hint: 'Not settled yet.', color: 'medium' },
  claim: { label: 'Claim', hint: 'We want this lot: make the offer.', color: 'success' },
  shortlist: { label: 'Shortlist', hint: 'Worth keeping in view: ask for more, wait for others.', color: 'warning' },
  pass: { label: 'Pass', hint: 'Not for us this time.', color: 'danger' },
}

export const priceUnitWords: Record<PriceUnit, string> = { kg: 'per kg', lb: 'per lb', bag: 'per bag', lot: 'for the lot' }

/** One pound in kilograms, exactly (international yard and pound agreement, 1959). */
const kgPerPound = 0.45359237
/** The defect sample the comparison counts per, in grams (SCA green grading uses 350 g; from memory). */
export const defectSampleBasisG = 350

export interface LotRow {
  lot: LocalRecord<'lot'>
  /** The table mean over the tasters' complete scores, on every table of the trip. */
  score: number | null
  tasters: number
  /** The lot's bowls on the latest table that has some, with when that table was. */
  bowls: BowlsSummary | null
  bowlsOn: string | null
  /** Asking price counted per kg, where its unit allows (lb, bag with its weight, lot with its size). */
  pricePerKg: number | null
  /** Defects counted per 350 g of green, where the sample weight is given. */
  defects: { primary: number, secondary: number } | null
  photos: number
}

function perKg(lot: LocalRecord<'lot'>): number | null {
  if (lot.askingPrice == null)
    return null
  if (lot.priceUnit === 'kg')
    return lot.askingPrice
  if (lot.priceUnit === 'lb')
    return lot.askingPrice / kgPerPound
  if (lot.priceUnit === 'bag')
    return lot.bagKg ? lot.askingPrice / lot.bagKg : null
  return lot.lotSizeKg ? lot.askingPrice / lot.lotSizeKg : null
}

function defectsOf(lot: LocalRecord<'lot'>): LotRow['defects'] {
  if (lot.primaryDefects == null && lot.secondaryDefects == null)
    return null
  const scale = lot.defectSampleG ? defectSampleBasisG / lot.defectSampleG : 1
  return { primary: (lot.primaryDefects ?? 0) * scale, secondary: (lot.secondaryDefects ?? 0) * scale }
}

/** What the comparison needs of a trip: its lots and what was measured, scored and photographed of them. */
export interface TripRecords {
  lots: LocalRecord<'lot'>[]
  tables: LocalRecord<'cuppingTable'>[]
  bowls: LocalRecord<'brew'>[]
  scores: LocalRecord<'score'>[]
  photos: LocalRecord<'photo'>[]
  sheetOf: (table: LocalRecord<'cuppingTable'>) => ScoreSheet
}

/** The trip's lots side by side, from the records on this phone (deleted ones left out). */
export function compareLots(trip: TripRecords): LotRow[] {
  const live = <T extends { deletedAt: string | null }>(rows: T[]): T[] => rows.filter(row => !row.deletedAt)
  const tables = new Map(live(trip.tables).map(table => [table.id, table]))
  return live(trip.lots).map((lot) => {
    const measured = live(trip.bowls).filter(bowl => bowl.context.kind === 'lot' && bowl.context.refId === lot.id && (bowl.derived?.tdsPercent ?? 0) > 0)
    // Bowls are compared within one table: the latest table the lot was cupped on.
    const latest = measured.reduce<LocalRecord<'brew'> | null>((last, bowl) => (!last || bowl.brewedAt > last.brewedAt ? bowl : last), null)
    // Numbered in the order they were brewed, as the table screen numbers them.
    const group = latest ? measured.filter(bowl => (bowl.context.tableId ?? null) === (latest.context.tableId ?? null)).sort((a, b) => a.brewedAt.localeCompare(b.brewedAt)) : []
    const table = latest?.context.tableId ? tables.get(latest.context.tableId) : undefined
    const totals = [...tables.values()].filter(t => t.lotIds.includes(lot.id)).map(t => ({ t, result: lotScores(trip.sheetOf(t), live(trip.scores).filter(s => s.tableId === t.id && s.lotId === lot.id)) }))
    const tasters = totals.reduce((sum, { result }) => sum + result.tasters, 0)
    const sum = totals.reduce((all, { result }) => all + (result.meanTotal ?? 0) * result.tasters, 0)
    return {
      lot,
      score: tasters ? sum / tasters : null,
      tasters,
      bowls: group.length ? summarizeBowls(group.map(bowl => ({ tdsPercent: bowl.derived!.tdsPercent!, yieldPercent: bowl.derived?.yieldPercent ?? null }))) : null,
      bowlsOn: table?.heldOn ?? latest?.brewedAt.slice(0, 10) ?? null,
      pricePerKg: perKg(lot),
      defects: defectsOf(lot),
      photos: live(trip.photos).filter(photo => photo.lotId === lot.id).length,
    }
  })
}

export type SortKey = 'farm' | 'score' | 'tds' | 'ey' | 'uniform' | 'moisture' | 'density' | 'defects' | 'price' | 'decision'
const decisionOrder: Record<LotDecision, number> = { claim: 0, shortlist: 1, open: 2, pass: 3 }

const sortValue: Record<SortKey, (row: LotRow) => number | string | null> = {
  farm: row => row.lot.farm.toLowerCase(),
  score: row => row.score,
  tds: row => row.bowls?.meanTdsPercent ?? null,
  ey: row => row.bowls?.meanYieldPercent ?? null,
  uniform: row => (row.bowls?.uniform === null || !row.bowls ? null : row.bowls.uniform ? 0 : 1),
  moisture: row => row.lot.moisturePercent,
  density: row => row.lot.densityGPerL,
  defects: row => (row.defects ? row.defects.primary * 1000 + row.defects.secondary : null),
  price: row => row.pricePerKg,
  decision: row => decisionOrder[row.lot.decision],
}

/** The rows sorted by one column, either way; lots without a value go last whichever way. */
export function sortLots(rows: readonly LotRow[], key: SortKey, direction: 'ascending' | 'descending'): LotRow[] {
  const sign = direction === 'ascending' ? 1 : -1
  return [...rows].sort((a, b) => {
    const x = sortValue[key](a)
    const y = sortValue[key](b)
    if (x === null || y === null)
      return x === y ? 0 : x === null ? 1 : -1
    return (x < y ? -1 : x > y ? 1 : 0) * sign || a.lot.farm.localeCompare(b.lot.farm)
  })
}

const blank = (value: number | string | null | undefined): number | string => value ?? ''
const altitude = (lot: LocalRecord<'lot'>): string => (lot.altitudeMinM === null ? '' : lot.altitudeMaxM === null ? String(lot.altitudeMinM) : `${lot.altitudeMinM}–${lot.altitudeMaxM}`)

/** The rows of the comparison's CSV export, units in the headers, figures at their display precision. */
export function comparisonCsvRows(rows: readonly LotRow[]): Record<string, string | number>[] {
  return rows.map(({ lot, score, tasters, bowls, bowlsOn, pricePerKg, photos }) => ({
    'lot': lot.farm,
    'seller\'s lot code': lot.reference,
    'region': lot.region,
    'altitude (m)': altitude(lot),
    'variety': lot.variety,
    'process': lot.process,
    'harvest': lot.harvest,
    'bags': blank(lot.bags),
    'kg per bag': blank(lot.bagKg),
    'lot size (kg)': blank(lot.lotSizeKg),
    'moisture (%)': blank(lot.moisturePercent),
    'water activity (aw)': blank(lot.waterActivity),
    'density (g/L)': blank(lot.densityGPerL),
    'screen size': lot.screenSize,
    'primary defects': blank(lot.primaryDefects),
    'secondary defects': blank(lot.secondaryDefects),
    'defect sample (g)': blank(lot.defectSampleG),
    'asking price': blank(lot.askingPrice),
    'currency': blank(lot.currency),
    'price per': priceUnitWords[lot.priceUnit],
    'price per kg': pricePerKg === null ? '' : roundHalfUp(pricePerKg, 2).toFixed(2),
    'score (table mean)': score === null ? '' : roundHalfUp(score, 2).toFixed(2),
    'tasters': tasters,
    'cupped on (YYYY-MM-DD)': blank(bowlsOn),
    'bowls': bowls?.n ?? 0,
    'mean TDS (%)': bowls ? formatTds(bowls.meanTdsPercent) : '',
    'mean extraction yield (%)': bowls?.meanYieldPercent != null ? formatYield(bowls.meanYieldPercent) : '',
    'TDS spread, SD (%)': bowls && bowls.n > 1 ? roundHalfUp(bowls.sdTdsPercent, 3).toFixed(3) : '',
    'bowls alike': bowls?.uniform == null ? '' : bowls.uniform ? 'yes' : `no: bowl ${bowls.outlier!.index + 1} at ${formatTds(bowls.outlier!.tdsPercent)} %TDS`,
    'decision': decisionWords[lot.decision].label,
    'reason': lot.decisionReason,
    'photos': photos,
  }))
}
