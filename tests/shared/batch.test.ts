import { describe, expect, it } from 'vitest'
import { scaleRecipe } from '../../shared/brewing'

const houseFilter = { method: 'percolation' as const, dose: 15, waterMass: 250, beverageMass: null, retainedRatio: 2 }

describe('scaleRecipe', () => {
  it('scales 15 g in 250 g of water to ten 200 g cups, counting what the grounds keep', () => {
    // By hand: the recipe gives 250 − 2.0 × 15 = 220 g of beverage, 14.667 g per gram of coffee.
    // 10 × 200 g = 2000 g of beverage needs 2000 / 14.667 = 136.36 g of coffee and
    // 2000 + 2.0 × 136.36 = 2272.7 g of water (LRR 2.0 g/g, common practice for paper filters).
    const batch = scaleRecipe(houseFilter, { cups: 10, cupMass: 200 })
    expect(batch.dose).toBeCloseTo(136.364, 3)
    expect(batch.waterMass).toBeCloseTo(2272.727, 3)
    expect(batch.beverageMass).toBe(2000)
    expect(batch.retained).toBeCloseTo(272.727, 3)
    // Scaling the water alone (× 8 for 2 L) would give 2000 − 2.0 × 120 = 1760 g: 240 g short.
    expect(batch.waterMass! - 2000).toBeGreaterThan(240)
  })

  it('takes litres of beverage as kilograms, and a batch brewer\'s own LRR', () => {
    // 2.5 L = 2500 g at 14.667 g/g: 170.45 g of coffee; with LRR 2.4: 2500 + 2.4 × 170.45 = 2909.1 g.
    const batch = scaleRecipe(houseFilter, { litres: 2.5 }, 2.4)
    expect(batch.dose).toBeCloseTo(170.455, 3)
    expect(batch.waterMass).toBeCloseTo(2909.091, 3)
  })

  it('scales an immersion from its poured-off beverage, with its common-practice LRR of 3.0', () => {
    // 20 g in 320 g of water keeps 3.0 × 20 = 60 g: 260 g poured off, 13 g per gram. Four 260 g cups
    // need 80 g of coffee and 1040 + 240 = 1280 g of water.
    const batch = scaleRecipe({ method: 'immersion', dose: 20, waterMass: 320, beverageMass: null, retainedRatio: null }, { cups: 4, cupMass: 260 })
    expect(batch.dose).toBeCloseTo(80, 10)
    expect(batch.waterMass).toBeCloseTo(1280, 10)
  })

  it('makes an espresso batch of whole shots', () => {
    const batch = scaleRecipe({ method: 'espresso', dose: 18, waterMass: null, beverageMass: 36, retainedRatio: null }, { litres: 0.5 })
    // 500 g / 36 g = 13.9, so 14 shots: 252 g of coffee, 504 g of espresso.
    expect(batch).toMatchObject({ dose: 252, beverageMass: 504, waterMass: null })
  })

  it.each([
    [{ cups: 0, cupMass: 200 }, 'cups'],
    [{ cups: 2.5, cupMass: 200 }, 'cups'],
    [{ cups: 3, cupMass: -1 }, 'cupMass'],
    [{ litres: 0 }, 'litres'],
  ])('refuses a batch of %o, naming the field', (size, field) => {
    expect(() => scaleRecipe(houseFilter, size)).toThrow(expect.objectContaining({ field }))
  })

  it('refuses a recipe whose grounds would keep all its water', () => {
    expect(() => scaleRecipe({ ...houseFilter, waterMass: 30 }, { cups: 2, cupMass: 200 })).toThrow(expect.objectContaining({ field: 'waterMass' }))
  })
})
