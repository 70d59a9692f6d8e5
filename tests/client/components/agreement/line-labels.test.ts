import { describe, expect, it } from 'vitest'
import { labelBaselineY } from '@/components/agreement/line-labels'

const AREA = { top: 10, bottom: 300 }

describe('labelBaselineY', () => {
  it('puts the label just above a line in the middle of the plot', () => {
    expect(labelBaselineY(150, AREA)).toBe(147)
  })

  it('keeps a 12 px label whole below the top of the plot when the line ends in the top corner', () => {
    const baseline = labelBaselineY(AREA.top, AREA, 12)

    expect(baseline - 12).toBeGreaterThanOrEqual(AREA.top)
  })

  it('keeps the label above the bottom of the plot', () => {
    expect(labelBaselineY(AREA.bottom + 40, AREA)).toBeLessThanOrEqual(AREA.bottom)
  })
})
