import { describe, expect, it } from 'vitest'
import { FIXED_OFFSET_CM, SETH_2002_MEDIANS, inclineAdjustedOffset, offsetFor } from '#shared/domain/offset'

describe('inclineAdjustedOffset', () => {
  // Seth R, Magner P, Matzinger F, van Walraven C. J Gen Intern Med 2002;17:861–865, abstract (Results):
  // median sternal angle to mid right atrium 5.4 cm supine, 8 cm at 30°, 9.7 cm at 45°, 9.8 cm at 60°.
  it.each([
    [0, 5.4],
    [30, 8.0],
    [45, 9.7],
    [60, 9.8],
  ])('at %s° gives the Seth 2002 median %s cm', (deg, cm) => {
    const offset = inclineAdjustedOffset(deg)

    expect(offset.offsetCm).toBeCloseTo(cm, 9)
    expect(offset.outsideStudiedRange).toBe(false)
  })

  it('holds the published medians as its table', () => {
    // Seth 2002, abstract (Results)
    expect(SETH_2002_MEDIANS).toEqual([
      [0, 5.4],
      [30, 8.0],
      [45, 9.7],
      [60, 9.8],
    ])
  })

  // Linear between the Seth 2002 medians: 5.4 + ½(8.0 − 5.4), 8.0 + ½(9.7 − 8.0), 9.7 + ½(9.8 − 9.7).
  it.each([
    [15, 6.7],
    [37.5, 8.85],
    [52.5, 9.75],
    [10, 5.4 + (10 / 30) * 2.6],
  ])('between medians, at %s° interpolates to %s cm', (deg, cm) => {
    const offset = inclineAdjustedOffset(deg)

    expect(offset.offsetCm).toBeCloseTo(cm, 9)
  })

  it.each([60.5, 75, 90])('above 60°, at %s° holds 9.8 cm and flags the angle as outside the studied range', (deg) => {
    const offset = inclineAdjustedOffset(deg)

    // Seth 2002 measured up to 60° only
    expect(offset).toEqual({ offsetCm: 9.8, outsideStudiedRange: true })
  })
})

describe('offsetFor', () => {
  // Classical teaching quotes 5 cm at every inclination (Seth 2002, abstract, Background).
  it.each([0, 30, 45, 60])('with fixed-5cm at %s° adds 5 cm', (deg) => {
    const offset = offsetFor('fixed-5cm', deg)

    expect(offset).toEqual({ offsetCm: FIXED_OFFSET_CM, outsideStudiedRange: false })
    expect(FIXED_OFFSET_CM).toBe(5)
  })

  it('with fixed-5cm above 60° still adds 5 cm but flags the angle as outside the studied range', () => {
    const offset = offsetFor('fixed-5cm', 80)

    expect(offset).toEqual({ offsetCm: 5, outsideStudiedRange: true })
  })

  it('with incline-adjusted follows the Seth 2002 medians', () => {
    const offset = offsetFor('incline-adjusted', 45)

    // Seth 2002, abstract (Results): 9.7 cm at 45°
    expect(offset.offsetCm).toBe(9.7)
  })
})
