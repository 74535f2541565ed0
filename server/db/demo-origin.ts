import { defaultScoreSheet } from '../../shared/brewing'
import { scoreIdOf } from '../../shared/records/rules'

/** A mutation as a phone would push it (demo-records.ts makes them). */
export interface DemoMutation { mutationId: string, entity: string, op: 'put', id: string, teamId: string, data: Record<string, unknown>, baseRev: number | null }
type Put = (entity: string, data: Record<string, unknown>, id?: string) => DemoMutation
type Bowl = (lot: DemoMutation, table: DemoMutation, tdsPercent: number, brewedAt: string) => DemoMutation[]

/** A demo photo's record and the committed picture that goes with it (server/db/demo-photos/). */
export interface DemoPhoto { id: string, file: string }

/**
 * The buying trip of the invented North Terraces: four lots offered by invented farms and a
 * cooperative, one cupping table with five bowls a lot (Marrowgate's third bowl stands apart), two
 * tasters' scores of every lot, a photo of Alder Ridge's green and one of the seller's offer sheet.
 */
export function demoOrigin(options: { put: Put, bowl: Bowl, at: (daysAgo: number, hour: number) => string, people: { owner: string, lead: string } }) {
  const { put, bowl, at, people } = options
  const trip = put('trip', { name: 'North Terraces buying trip', origin: 'North Terraces', startsOn: at(10, 0).slice(0, 10), endsOn: at(3, 0).slice(0, 10), notes: 'Sample run with the North Terraces Growers\' Exchange.' })
  const graded = { harvest: '2025/26 main crop', defectSampleG: 350, priceUnit: 'kg', currency: 'EUR' }
  const alder = put('lot', { tripId: trip.id, farm: 'Alder Ridge Estate', reference: 'AR-14', region: 'North Terraces', altitudeMinM: 1650, altitudeMaxM: 1800, variety: 'Typica', process: 'washed', bags: 20, bagKg: 69, lotSizeKg: 1380, moisturePercent: 10.8, waterActivity: 0.55, densityGPerL: 735, screenSize: '16/18', primaryDefects: 0, secondaryDefects: 3, askingPrice: 7.4, ...graded, notes: 'Drying beds in the shade, raked every hour.', decision: 'claim', decisionReason: 'Clean, sweet and even bowls; the best price per point on the table.' })
  const copperbeck = put('lot', { tripId: trip.id, farm: 'Copperbeck Farm', reference: 'CB-03', region: 'South Valley', altitudeMinM: 1400, altitudeMaxM: 1550, variety: 'Bourbon', process: 'natural', bags: 10, bagKg: 69, lotSizeKg: 690, moisturePercent: 11.4, waterActivity: 0.6, densityGPerL: 700, screenSize: '15+', primaryDefects: 1, secondaryDefects: 6, askingPrice: 8.1, ...graded, notes: '' })
  const hollin = put('lot', { tripId: trip.id, farm: 'Hollin Step Cooperative', reference: 'HS-21', region: 'North Terraces', altitudeMinM: 1700, altitudeMaxM: null, variety: 'Caturra, Typica', process: 'honey', bags: 40, bagKg: 60, lotSizeKg: 2400, moisturePercent: 10.5, waterActivity: 0.53, densityGPerL: 748, screenSize: '17/18', primaryDefects: 0, secondaryDefects: 2, askingPrice: 6.2, ...graded, notes: 'Blend of twelve members\' lots.' })
  const marrowgate = put('lot', { tripId: trip.id, farm: 'Marrowgate Washing Station', reference: 'MG-08', region: 'Lower Terraces', altitudeMinM: 1300, altitudeMaxM: 1450, variety: 'Catuai', process: 'washed', bags: 60, bagKg: 60, lotSizeKg: 3600, moisturePercent: 11.9, waterActivity: 0.63, densityGPerL: 672, screenSize: '15/16', primaryDefects: 2, secondaryDefects: 11, askingPrice: 5.8, ...graded, notes: '', decision: 'pass', decisionReason: 'Uneven bowls and a tainted cup; moisture near 12 %.' })
  const lots = [alder, copperbeck, hollin, marrowgate]
  const table = put('cuppingTable', { tripId: trip.id, heldOn: at(3, 0).slice(0, 10), place: 'Hollin Step cupping room', lotIds: lots.map(lot => lot.id), doseG: 8.25, waterMl: 150, waterTemperatureC: 93, grind: 'Bench grinder, setting 9', bowlsPerLot: 5, scoreSheetId: null, notes: 'Spring water from the cooperative\'s tank.' })

  // Strength of each bowl, %TDS: four lots of five bowls; Marrowgate's third bowl reads far from its others.
  const strengths = [[1.12, 1.13, 1.12, 1.11, 1.13], [1.21, 1.22, 1.2, 1.22, 1.21], [1.16, 1.17, 1.15, 1.16, 1.17], [1.05, 1.06, 1.19, 1.04, 1.05]]
  const bowls = lots.flatMap((lot, l) => strengths[l]!.flatMap((tds, b) => bowl(lot, table, tds, at(3, 10 + l + b / 10))))

  // Scores on the trade's attributes: six attributes around 7.5–8.25, the cup counts at 10 but for a
  // tainted cup of Marrowgate's, and an overall impression.
  const score = (lot: DemoMutation, taster: string, marks: number[], cups = [10, 10, 10], deduction = 0) => put('score', {
    tableId: table.id,
    lotId: lot.id,
    values: defaultScoreSheet.attributes.map((attribute, i) => ({ attribute: attribute.key, value: attribute.step ? cups[i - 6]! : marks[i < 6 ? i : 6]! })),
    deduction,
    notes: '',
  }, scoreIdOf(table.id, lot.id, taster))
  const leadScores = [
    score(alder, people.lead, [8, 8, 7.75, 8, 7.75, 7.75, 8]),
    score(copperbeck, people.lead, [8.25, 8, 7.75, 7.5, 8, 7.75, 7.75]),
    score(hollin, people.lead, [7.75, 7.75, 7.5, 7.75, 7.5, 7.75, 7.75]),
    score(marrowgate, people.lead, [7.25, 7, 7, 7.25, 7.25, 7, 7], [8, 8, 10], 2),
  ]
  const ownerScores = [
    score(alder, people.owner, [8.25, 8, 8, 8, 7.75, 8, 8.25]),
    score(copperbeck, people.owner, [8, 7.75, 7.75, 7.5, 7.75, 7.5, 7.5]),
    score(hollin, people.owner, [7.75, 7.5, 7.5, 7.75, 7.75, 7.5, 7.5]),
    score(marrowgate, people.owner, [7, 7, 7, 7.25, 7, 7, 7], [8, 8, 10], 2),
  ]
  const greenPhoto = put('photo', { subject: 'lot', tripId: trip.id, lotId: alder.id, brewId: null, caption: 'Alder Ridge green, 350 g sample', contentType: 'image/jpeg', sizeBytes: 87_225, width: 960, height: 720, takenAt: at(4, 9) })
  const offerPhoto = put('photo', { subject: 'document', tripId: trip.id, lotId: null, brewId: null, caption: 'The exchange\'s offer sheet', contentType: 'image/jpeg', sizeBytes: 39_002, width: 720, height: 960, takenAt: at(5, 16) })

  return {
    trip,
    lots,
    /** The owner sets up the trip, its lots and the table; the lead measures the bowls. */
    setup: [trip, ...lots, table],
    lead: [...bowls, ...leadScores, greenPhoto, offerPhoto],
    owner: ownerScores,
    photos: [{ id: greenPhoto.id, file: 'alder-ridge-green.jpg' }, { id: offerPhoto.id, file: 'north-terraces-offer.jpg' }] satisfies DemoPhoto[],
  }
}
