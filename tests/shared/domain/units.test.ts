import { UcumLhcUtils } from '@lhncbc/ucum-lhc'
import { describe, expect, it } from 'vitest'
import {
  CMH2O_PER_MMHG,
  PASCALS_PER_CMH2O,
  PASCALS_PER_MMHG,
  cmH2OToMmHg,
  mmHgToCmH2O,
  withoutFloatNoise,
} from '#shared/domain/units'

const ucum = UcumLhcUtils.getInstance()

function ucumConvert(from: string, value: number, to: string): number {
  const result = ucum.convertUnitTo(from, value, to)
  expect(result.status).toBe('succeeded')
  return result.toVal!
}

describe('pressure units', () => {
  it('uses the conventional millimetre of mercury, 133.3224 Pa', () => {
    // NIST SP 811 (2008), App. B.8: millimeter of mercury, conventional = 1.333 224 E+02 Pa
    expect(PASCALS_PER_MMHG).toBeCloseTo(133.3224, 4)
  })

  it('uses the conventional centimetre of water, 98.0665 Pa', () => {
    // NIST SP 811 (2008), App. B.8: centimeter of water, conventional = 9.806 65 E+01 Pa
    expect(PASCALS_PER_CMH2O).toBe(98.0665)
  })

  it('counts 1.35951 cmH₂O in one mmHg', () => {
    // NIST SP 811 App. B.8: 133.3224 / 98.0665 = 1.35951
    expect(CMH2O_PER_MMHG).toBeCloseTo(1.35951, 5)
  })

  it('converts 13.7 cmH₂O to 10.08 mmHg', () => {
    // NIST SP 811 App. B.8 factors: 13.7 × 98.0665 / 133.3224
    expect(cmH2OToMmHg(13.7)).toBeCloseTo((13.7 * 98.0665) / 133.3224, 4)
    expect(cmH2OToMmHg(13.7)).toBeCloseTo(10.08, 2)
  })

  it('returns the starting value after a round trip', () => {
    const cmH2O = 17.3

    const roundTrip = mmHgToCmH2O(cmH2OToMmHg(cmH2O))

    expect(roundTrip).toBeCloseTo(cmH2O, 12)
  })
})

describe('pressure units against UCUM (NLM ucum-lhc)', () => {
  // UCUM defines m[Hg] as 133.3220 kPa, four digits short of NIST's conventional value: agreement to 1 part in 10⁵.
  const RELATIVE = 1e-5

  it.each([1, 5, 7.35, 10, 20])('converts %s mm[Hg] to cm[H2O] like UCUM', (mmHg) => {
    const expected = ucumConvert('mm[Hg]', mmHg, 'cm[H2O]')

    const actual = mmHgToCmH2O(mmHg)

    expect(Math.abs(actual - expected) / expected).toBeLessThan(RELATIVE)
  })

  it.each([1, 5, 10, 13.7, 30])('converts %s cm[H2O] to mm[Hg] like UCUM', (cmH2O) => {
    const expected = ucumConvert('cm[H2O]', cmH2O, 'mm[Hg]')

    const actual = cmH2OToMmHg(cmH2O)

    expect(Math.abs(actual - expected) / expected).toBeLessThan(RELATIVE)
  })

  it('agrees with UCUM on the pascal value of each unit', () => {
    // UCUM: cm[H2O] = 980665e-5 kPa per cm, exactly the NIST value
    expect(ucumConvert('cm[H2O]', 1, 'Pa')).toBeCloseTo(PASCALS_PER_CMH2O, 9)
    expect(ucumConvert('mm[Hg]', 1, 'Pa')).toBeCloseTo(PASCALS_PER_MMHG, 2)
  })
})

describe('withoutFloatNoise', () => {
  it('turns 9.7 + (−4.7) into exactly 5', () => {
    const sum = 9.7 + -4.7

    const cleaned = withoutFloatNoise(sum)

    expect(sum).not.toBe(5)
    expect(cleaned).toBe(5)
  })
})
