import type { DemoMutation, DemoPhoto } from './demo-origin'
import { v7 as uuidv7 } from 'uuid'
import { brixToRefractiveIndex, defaultBrixFactor } from '../../shared/brewing'
import { demoCompetition } from './demo-competition'
import { demoOrigin } from './demo-origin'

/**
 * The demo team's records, all invented: two refractometers (one calibrated with sucrose
 * standards), a recipe with its versions, a buying trip with four lots cupped on a table
 * (demo-origin.ts), a competition with a signed-off heat and one under way (demo-competition.ts), a
 * week of brews measured against them, and a dial-in at a night market of five attempts whose last
 * became the crew's house recipe. Returned per author, in the order they must be pushed, with the
 * photos whose pictures the seed stores. An edit of a record pushed earlier goes with that record's
 * rev, which the seed fills in as it pushes.
 */
export function demoRecords(teamId: string, people: { owner: string, lead: string, member: string }, now = Date.now()): { userId: string, mutations: DemoMutation[], photos?: DemoPhoto[] }[] {
  const put = (entity: string, data: Record<string, unknown>, id = uuidv7()): DemoMutation => ({ mutationId: uuidv7(), entity, op: 'put', id, teamId, data, baseRev: null })
  const at = (daysAgo: number, hour: number): string => new Date(Math.floor(now / 86_400_000 - daysAgo) * 86_400_000 + hour * 3_600_000).toISOString()

  const prism = put('instrument', { label: 'Quayside prism', readingKind: 'nD', resolution: 0.00001, repeatability: 0.00002, brixFactor: null, notes: 'Bench refractometer with temperature compensation.' })
  const pen = put('instrument', { label: 'Bar pen', readingKind: 'tds', resolution: 0.01, repeatability: 0.02, brixFactor: null, notes: 'Pocket meter for the brew bar.' })
  // Sucrose standards of 0, 1, 2 and 3 °Brix (the filter range) read close to the ICUMSA table's nD at 20 °C.
  const standards = [[0, 1.33300], [1, 1.33442], [2, 1.33587], [3, 1.33731]].map(([concentration, reading]) => ({ concentration, reading }))
  const line = put('calibration', { instrumentId: prism.id, standardUnit: 'brix', points: standards, zeroReading: 1.33300, temperatureC: 20, active: true, calibratedAt: at(6, 8), notes: 'Fresh standards, mixed by mass.' })
  // A recipe is its first version's settings; each change is a version of its own (recipe-rules.ts).
  const houseFilter = { name: 'House filter', method: 'percolation', dose: 15, waterMass: 250, targetTdsPercent: 1.3, targetYieldPercent: 20.5, grindSetting: '22 clicks', contactTimeSeconds: 210, waterTemperatureC: 94, notes: 'Paper filter, 40 s bloom.', beverageMass: 220, retainedRatio: 2, timeToleranceSeconds: null, zoneId: 'european-drip', retired: false }
  const recipeId = uuidv7()
  const firstVersion = put('recipeVersion', { recipeId, number: 1, basedOnId: null, reason: 'The crew\'s filter as brewed at the quay', settings: houseFilter })
  const recipe = put('recipe', { ...houseFilter, versionId: firstVersion.id }, recipeId)
  const competition = demoCompetition(put, people, pen, at, now)

  const brew = (data: Record<string, unknown>, values: number[], kind: string, instrument: DemoMutation, calibration: DemoMutation | null): DemoMutation[] => {
    const made = put('brew', { context: { kind: 'quick', refId: null }, instrumentId: instrument.id, calibrationId: calibration?.id ?? null, strengthSource: calibration ? 'calibration' : 'direct', ...data })
    return [made, ...values.map(value => put('reading', { brewId: made.id, value, kind, temperatureC: null, instrumentId: instrument.id, calibrationId: calibration?.id ?? null, takenAt: made.data.brewedAt }))]
  }
  // A cupping bowl read twice on the prism: the nD sucrose of the same °Brix shows (ICUMSA), TDS = 0.85 × °Brix.
  const nD = (tdsPercent: number): number => Math.round(brixToRefractiveIndex(tdsPercent / defaultBrixFactor) * 1e5) / 1e5
  const bowl = (lot: DemoMutation, table: DemoMutation, tds: number, brewedAt: string) => brew({ context: { kind: 'lot', refId: lot.id, tableId: table.id }, method: 'immersion', dose: 8.25, waterMass: 150, brixFactor: 0.85, grindSetting: 'Bench grinder, setting 9', contactTimeSeconds: null, waterTemperatureC: 93, brewedAt }, [nD(tds), nD(tds) + 0.00001], 'nD', prism, line)
  const origin = demoOrigin({ put, bowl, at, people })

  // The Gullstone Night Market (invented): a new grinder and the market's standpipe water. Five
  // attempts on the House filter, one change each, until the fifth lands on the target.
  const market = put('dialIn', { recipeId, method: 'percolation', place: 'Gullstone Night Market, stall 7', grinder: 'Flat-burr grinder, burrs two weeks old', water: 'Market standpipe through a jug filter', zoneId: null, startedAt: at(1, 17), notes: 'Queue from half past five.' })
  const minutes = (count: number): string => new Date(Date.parse(at(1, 17)) + count * 60_000).toISOString()
  const attempt = (step: number, change: string, grind: string, temperature: number, beverageMass: number, tds: number[]) => brew({ context: { kind: 'recipe', refId: recipeId, versionId: firstVersion.id, sessionId: market.id }, method: 'percolation', dose: 15, beverageMass, waterMass: 250, grindSetting: grind, contactTimeSeconds: 200 + step * 5, waterTemperatureC: temperature, changeNote: change, notes: '', brewedAt: minutes(step * 8) }, tds, 'tds', pen, null)
  const attempts = [
    attempt(1, 'The House filter as written', '22 clicks', 94, 226, [1.18, 1.19, 1.18]),
    attempt(2, 'Two clicks finer', '20 clicks', 94, 224.5, [1.26, 1.26, 1.27]),
    attempt(3, 'Two more clicks finer', '18 clicks', 94, 223, [1.33, 1.32, 1.33]),
    attempt(4, 'Water up to 96 °C', '18 clicks', 96, 222.5, [1.36, 1.36, 1.35]),
    attempt(5, 'One click finer', '17 clicks', 96, 222, [1.38, 1.38, 1.39]),
  ]
  const fifth = attempts[4]![0]!
  const adopted = { ...houseFilter, grindSetting: '17 clicks', waterTemperatureC: 96, contactTimeSeconds: 225, beverageMass: 222 }
  const secondVersion = put('recipeVersion', { recipeId, number: 2, basedOnId: firstVersion.id, reason: 'Attempt 5 of the dial-in at Gullstone Night Market: new burrs grind coarser', settings: adopted, fromBrewId: fifth.id })

  return [
    { userId: people.owner, mutations: [prism, pen, line, firstVersion, recipe, ...origin.setup, ...competition.setUp] },
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
      ],
    },
    { userId: people.lead, mutations: origin.lead, photos: origin.photos },
    { userId: people.owner, mutations: origin.owner },
    {
      userId: people.owner,
      mutations: [
        ...brew({ method: 'espresso', dose: 18, beverageMass: 38.5, grindSetting: '2.4', contactTimeSeconds: 29, waterTemperatureC: 93, notes: 'Guest espresso', brewedAt: at(2, 14) }, [9.4, 9.5, 9.45], 'tds', pen, null),
      ],
    },
    // The judges measure the pours; then the head judge signs Heat 1 off from the phone.
    { userId: people.member, mutations: competition.measured },
    { userId: people.lead, mutations: competition.signedOff },
    {
      userId: people.lead,
      mutations: [
        market,
        ...attempts.flat(),
        secondVersion,
        put('recipe', { ...adopted, versionId: secondVersion.id }, recipeId),
        put('houseRecipe', { method: 'percolation', recipeId }),
      ],
    },
  ]
}
