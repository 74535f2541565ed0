import { describe, expect, it } from 'vitest'
import { brewRatio, cuppingDose, cuppingRatio, formatRatio, gramsPerLitre, gramsPerLitreFromRatio, ratioFromGramsPerLitre } from '../../shared/brewing'

describe('brew ratio both ways', () => {
  it('writes 15 g on 250 g of water as 1:16.7 and 60 g/L', () => {
    expect(formatRatio(brewRatio(15, 250))).toBe('1:16.7')
    expect(gramsPerLitre(15, 250)).toBeCloseTo(60, 10)
  })

  it('turns 60 g/L into 1:16.7 and back', () => {
    expect(ratioFromGramsPerLitre(60)).toBeCloseTo(16.667, 3)
    expect(gramsPerLitreFromRatio(ratioFromGramsPerLitre(60))).toBeCloseTo(60, 10)
  })

  it('puts the US drip standard\'s 55 g/L at about 1:18.2 (SCAA brewing standard)', () => {
    expect(formatRatio(ratioFromGramsPerLitre(55))).toBe('1:18.2')
  })
})

describe('cuppingDose', () => {
  // SCA cupping protocol: 8.25 g ± 0.25 g of coffee per 150 mL of water (0.055 g/mL).
  it('gives 8.25 g for a 150 mL bowl, with 8.00 to 8.50 g allowed', () => {
    const bowl = cuppingDose(150)
    expect(bowl.dose).toBeCloseTo(8.25, 10)
    expect(bowl.min).toBeCloseTo(8.0, 10)
    expect(bowl.max).toBeCloseTo(8.5, 10)
  })

  it('scales to the bowl: 0.055 g per mL', () => {
    expect(cuppingRatio.gramsPerMl).toBeCloseTo(0.055, 12)
    expect(cuppingDose(200).dose).toBeCloseTo(11, 10)
  })
})
