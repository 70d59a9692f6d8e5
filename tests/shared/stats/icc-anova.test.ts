import { describe, expect, it } from 'vitest'
import { meanSquares } from '#shared/stats/icc-anova'
import { SHROUT_FLEISS_1979 } from './reference-data.ts'

describe('meanSquares', () => {
  it('reproduces the Shrout & Fleiss 1979 analysis of variance', () => {
    const ratings = SHROUT_FLEISS_1979

    const ms = meanSquares(ratings)

    // Shrout & Fleiss 1979 ANOVA table: BMS 11.24, WMS 6.26, JMS 32.49, EMS 1.02. Re-run in R 4 with the data in long
    // form (y, subj, judge as factors): anova(aov(y ~ subj + judge)) → subj 11.242, judge 32.486, Residuals 1.019;
    // anova(aov(y ~ subj)) → Residuals (within) 6.2639
    expect(ms.rows).toBeCloseTo(11.24, 2)
    expect(ms.within).toBeCloseTo(6.26, 2)
    expect(ms.columns).toBeCloseTo(32.49, 2)
    expect(ms.error).toBeCloseTo(1.02, 2)
  })
})
