import { v7 as uuidv7 } from 'uuid'
import { brixToRefractiveIndex, defaultBrixFactor } from '../../shared/brewing'
import { demoCompetition } from './demo-competition'

/** A mutation as a phone would push it, for the demo team's first records. */
export interface DemoMutation { mutationId: string, entity: string, op: 'put', id: string, teamId: string, data: Record<string, unknown>, baseRev: null }

/**
 * The demo team's records, all invented: two refractometers (one calibrated with sucrose
 * standards), a house recipe, a buying trip with two lots, a competition with a signed-off heat and
 * one under way (demo-competition.ts), and a week of brews measured against them. Returned per author, in the order they must be pushed.
 */
export function demoRecords(teamId: string, people: { owner: string, lead: string, member: string }, now = Date.now()): { userId: string, mutations: DemoMutation[] }[] {
  const put = (entity: string, data: Record<string, unknown>): DemoMutation => ({ mutationId: uuidv7(), entity, op: 'put', id: uuidv7(), teamId, data, baseRev: null })
  const at = (daysAgo: number, hour: number): string => new Date(Math.floor(now / 86_400_000 - daysAgo) * 86_400_000 + hour * 3_600_000).toISOString()

  const prism = put('instrument', { label: 'Quayside prism', readingKind: 'nD', resolution: 0.00001, repeatability: 0.00002, brixFactor: null, notes: 'Bench refractometer with temperature compensation.' })
  const pen = put('instrument', { label: 'Bar pen', readingKind: 'tds', resolution: 0.01, repeatability: 0.02, brixFactor: null, notes: 'Pocket meter for the brew bar.' })
  // Sucrose standards of 0, 1, 2 and 3 °Brix (the filter range) read close to the ICUMSA table's nD at 20 °C.
  const standards = [[0, 1.33300], [1, 1.33442], [2, 1.33587], [3, 1.33731]].map(([concentration, reading]) => ({ concentration, reading }))
  const line = put('calibration', { instrumentId: prism.id, standardUnit: 'brix', points: standards, zeroReading: 1.33300, temperatureC: 20, active: true, calibratedAt: at(6, 8), notes: 'Fresh standards, mixed by mass.' })
  const recipe = put('recipe', { name: 'House filter', method: 'percolation', dose: 15, waterMass: 250, targetTdsPercent: 1.3, targetYieldPercent: 20.5, grindSetting: '22 clicks', contactTimeSeconds: 210, waterTemperatureC: 94, notes: 'Paper filter, 40 s bloom.' })
  const trip = put('trip', { name: 'North Terraces buying trip', origin: 'North Terraces', startsOn: at(10, 0).slice(0, 10), endsOn: at(3, 0).slice(0, 10), notes: '' })
  const alder = put('lot', { tripId: trip.id, farm: 'Alder Ridge Estate', region: 'North Terraces', variety: 'Typica', process: 'washed', moisturePercent: 10.8, lotSizeKg: 1380, askingPrice: 7.4, currency: 'EUR', notes: '' })
  const copperbeck = put('lot', { tripId: trip.id, farm: 'Copperbeck Farm', region: 'South Valley', variety: 'Bourbon', process: 'natural', moisturePercent: 11.4, lotSizeKg: 690, askingPrice: 8.1, currency: 'EUR', notes: '' })
  const competition = demoCompetition(put, people, pen, at, now)

  const brew = (data: Record<string, unknown>, values: number[], kind: string, instrument: DemoMutation, calibration: DemoMutation | null): DemoMutation[] => {
    const made = put('brew', { context: { kind: 'quick', refId: null }, instrumentId: instrument.id, calibrationId: calibration?.id ?? null, strengthSource: calibration ? 'calibration' : 'direct', ...data })
    return [made, ...values.map(value => put('reading', { brewId: made.id, value, kind, temperatureC: null, instrumentId: instrument.id, calibrationId: calibration?.id ?? null, takenAt: made.data.brewedAt }))]
  }
  // A cupping bowl read on the prism: the nD sucrose of the same °Brix shows (ICUMSA), TDS = 0.85 × °Brix.
  const nD = (tdsPercent: number): number => Math.round(brixToRefractiveIndex(tdsPercent / defaultBrixFactor) * 1e5) / 1e5
  const bowl = (lot: DemoMutation, tds: number[], daysAgo: number) => brew({ context: { kind: 'lot', refId: lot.id }, method: 'immersion', dose: 8.25, waterMass: 150, brixFactor: 0.85, grindSetting: 'cupping', contactTimeSeconds: 240, waterTemperatureC: 93, brewedAt: at(daysAgo, 15) }, tds.map(nD), 'nD', prism, line)

  return [
    { userId: people.owner, mutations: [prism, pen, line, recipe, trip, alder, copperbeck, ...competition.setUp] },
    {
      userId: people.member,
      mutations: [
        ...brew({ method: 'percolation', doseGross: 27.6, doseTare: 12.5, beverageGross: 655.0, beverageTare: 412.6, grindSetting: '22 clicks', contactTimeSeconds: 205, waterTemperatureC: 94, notes: 'V60, 40 s bloom', brewedAt: at(5, 9) }, [1.31, 1.33, 1.32], 'tds', pen, null),
        ...brew({ method: 'percolation', dose: 15, beverageMass: 236, grindSetting: '26 clicks', contactTimeSeconds: 170, waterTemperatureC: 92, notes: 'Too coarse after the burr change', brewedAt: at(4, 10) }, [1.12, 1.1, 1.11], 'tds', pen, null),
      ],
    },
    {
      userId: people.lead,
      mutations: [
        ...brew({ context: { kind: 'recipe', refId: recipe.id }, method: 'percolation', dose: 15, beverageMass: 246, grindSetting: '21 clicks', contactTimeSeconds: 230, waterTemperatureC: 95, notes: '', brewedAt: at(3, 11) }, [1.36, 1.37], 'tds', pen, null),
        ...bowl(alder, [1.12, 1.13, 1.12], 3),
        ...bowl(copperbeck, [1.22, 1.21, 1.23], 3),
      ],
    },
    {
      userId: people.owner,
      mutations: [
        ...brew({ method: 'espresso', dose: 18, beverageMass: 38.5, grindSetting: '2.4', contactTimeSeconds: 29, waterTemperatureC: 93, notes: 'Guest espresso', brewedAt: at(2, 14) }, [9.4, 9.5, 9.45], 'tds', pen, null),
      ],
    },
    // The judges measure the pours; then the head judge signs Heat 1 off from the phone.
    { userId: people.member, mutations: competition.measured },
    { userId: people.lead, mutations: competition.signedOff },
  ]
}
