import { describe, expect, it } from 'vitest'
import * as b from '../../shared/brewing'

const fit = b.fitCalibration([{ concentration: 0, reading: 1.33299 }, { concentration: 10, reading: 1.34782 }, { concentration: 20, reading: 1.36384 }])

// Every bad input gets the one error class, naming the field, with a sentence for a person.
const cases: [string, () => unknown, string][] = [
  ['NaN strength', () => b.percolationYield({ tdsPercent: Number.NaN, beverageMass: 240, dose: 15 }), 'tdsPercent'],
  ['infinite beverage', () => b.percolationYield({ tdsPercent: 1.3, beverageMass: Number.POSITIVE_INFINITY, dose: 15 }), 'beverageMass'],
  ['dose 0', () => b.percolationYield({ tdsPercent: 1.3, beverageMass: 240, dose: 0 }), 'dose'],
  ['negative dose', () => b.immersionYield({ tdsPercent: 1.3, waterMass: 180, dose: -10 }), 'dose'],
  ['strength of 100 %', () => b.immersionYield({ tdsPercent: 100, waterMass: 180, dose: 10 }), 'tdsPercent'],
  ['strength of 0', () => b.percolationYield({ tdsPercent: 0, beverageMass: 240, dose: 15 }), 'tdsPercent'],
  ['negative water', () => b.immersionSolids({ tdsPercent: 1.3, waterMass: -1 }), 'waterMass'],
  ['negative LRR', () => b.decantedYield({ tdsPercent: 1.3, beverageMass: 200, dose: 15, retainedRatio: -1 }), 'retainedRatio'],
  ['grounds that keep all the water', () => b.beverageFromWater({ waterMass: 20, dose: 15, retainedRatio: 2 }), 'waterMass'],
  ['negative gross weight', () => b.massByDifference(-1, 0), 'gross'],
  ['gross lighter than tare', () => b.massByDifference(400, 412.6), 'gross'],
  ['NaN tare', () => b.massByDifference(400, Number.NaN), 'tare'],
  ['moisture of 100 %', () => b.dryDose(18, 100), 'moisturePercent'],
  ['negative moisture', () => b.dryDose(18, -1), 'moisturePercent'],
  ['one standard', () => b.fitCalibration([{ concentration: 0, reading: 1.333 }]), 'points'],
  ['two standards of one concentration', () => b.fitCalibration([{ concentration: 5, reading: 1.340 }, { concentration: 5, reading: 1.341 }]), 'points'],
  ['readings that never change (zero slope)', () => b.fitCalibration([{ concentration: 0, reading: 1.34 }, { concentration: 10, reading: 1.34 }]), 'points'],
  ['a NaN standard', () => b.fitCalibration([{ concentration: 0, reading: 1.333 }, { concentration: Number.NaN, reading: 1.35 }]), 'points.1.concentration'],
  ['a NaN reading to invert', () => b.concentrationFromReading(fit, Number.NaN), 'reading'],
  ['zero replicates', () => b.inverseUncertainty(fit, 1.35, 0), 'replicates'],
  ['°Brix above the table', () => b.brixToRefractiveIndex(31), 'brix'],
  ['nD below the table', () => b.refractiveIndexToBrix(1.3), 'refractiveIndex'],
  ['a negative °Brix reading', () => b.tdsFromBrix(-0.5), 'brix'],
  ['a °Brix factor of 0', () => b.tdsFromBrix(1.5, 0), 'factor'],
  ['an unknown reading kind', () => b.zeroCheck(0, 'volts' as b.ReadingKind), 'kind'],
  ['no readings', () => b.summarizeReadings([]), 'readings'],
  ['an infinite reading', () => b.summarizeReadings([1.3, Number.POSITIVE_INFINITY]), 'readings.1'],
  ['a zero scale resolution', () => b.yieldUncertainty({ method: 'percolation', tdsPercent: 1.3, dose: 15, beverageMass: 240, scaleResolution: 0, repeatabilityTdsPercent: 0.02 }), 'scaleResolution'],
  ['an immersion without water', () => b.yieldUncertainty({ method: 'immersion', tdsPercent: 1.3, dose: 15, scaleResolution: 0.1, repeatabilityTdsPercent: 0.02 }), 'waterMass'],
  ['an unknown method', () => b.yieldUncertainty({ method: 'siphon' as b.BrewMethod, tdsPercent: 1.3, dose: 15, beverageMass: 240, scaleResolution: 0.1, repeatabilityTdsPercent: 0.02 }), 'method'],
  ['a negative repeatability', () => b.yieldUncertainty({ method: 'percolation', tdsPercent: 1.3, dose: 15, beverageMass: 240, scaleResolution: 0.1, repeatabilityTdsPercent: -0.1 }), 'repeatabilityTdsPercent'],
  ['a recipe with both dose and beverage', () => b.solveRecipe({ targetTdsPercent: 1.3, targetYieldPercent: 20, method: 'percolation', dose: 15, beverageMass: 240 }), 'dose'],
  ['a recipe with neither dose nor beverage', () => b.solveRecipe({ targetTdsPercent: 1.3, targetYieldPercent: 20, method: 'percolation' }), 'dose'],
  ['a recipe target of 100 % extraction', () => b.solveRecipe({ targetTdsPercent: 1.3, targetYieldPercent: 100, method: 'percolation', dose: 15 }), 'targetYieldPercent'],
  ['an immersion too strong for its grounds', () => b.solveRecipe({ targetTdsPercent: 9, targetYieldPercent: 20, method: 'immersion', dose: 15 }), 'targetTdsPercent'],
  ['a verdict on 0 % extraction', () => b.zoneVerdict(b.zonePresets[0]!, { tdsPercent: 1.3, yieldPercent: 0 }), 'yieldPercent'],
  ['a zone without a name', () => b.defineZone({ id: 'z', name: ' ', tdsPercent: { min: 1, max: 2 }, yieldPercent: { min: 18, max: 22 } }), 'name'],
  ['a cupping bowl of 0 mL', () => b.cuppingDose(0), 'waterMl'],
  ['a brew ratio with no beverage', () => b.brewRatio(15, 0), 'beverageMass'],
  ['rounding to 1.5 decimals', () => b.roundHalfUp(1.2, 1.5), 'decimals'],
  ['rounding NaN', () => b.roundHalfUp(Number.NaN, 2), 'value'],
  ['a scale resolution of −0.1 g', () => b.formatMass(18, -0.1), 'resolution'],
]

describe('bad input', () => {
  it.each(cases)('refuses %s, naming the field', (_what, call, field) => {
    let caught: unknown
    try {
      call()
    }
    catch (error) {
      caught = error
    }
    expect(caught).toBeInstanceOf(b.BrewingInputError)
    expect((caught as b.BrewingInputError).field).toBe(field)
    expect((caught as Error).message).toMatch(/^[A-Z].+[.:]/)
  })
})
