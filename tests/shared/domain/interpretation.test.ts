import { describe, expect, it } from 'vitest'
import { CAUTION_TEXT, categoriesInBand, categoryOf, elevatedOf } from '#shared/domain/interpretation'
import { DEFAULT_ESTIMATE_SETTINGS as defaults, EstimateSettingsSchema } from '#shared/schemas/settings'

describe('categoryOf', () => {
  // Categories of Cook 1990 (Am J Med Sci, PMID 2316561), a definition rather than a statistic: the study's low and
  // high CVP groups, low < 5, normal 5–10, high > 10 cmH₂O.
  it.each([
    [4.999, 'low'],
    [5, 'normal'],
    [4.999999999999999, 'normal'],
    [10, 'normal'],
    [10.000000000000002, 'normal'],
    [10.001, 'high'],
  ])('calls %s cmH₂O %s', (cvp, category) => {
    expect(categoryOf(cvp, defaults)).toBe(category)
  })
})

describe('categoriesInBand', () => {
  it.each<[[number | null, number | null] | null, string[]]>([
    [[5, 10], ['normal']],
    [[4.9, 6], ['low', 'normal']],
    [[4.9, 10.1], ['low', 'normal', 'high']],
    [[9.2, 18.2], ['normal', 'high']],
    [[4.999999999999999, 10.000000000000002], ['normal']],
    // A lower bound: its limit's category and those above
    [[10.1, null], ['high']],
    [[10, null], ['normal', 'high']],
    [[-2, null], ['low', 'normal', 'high']],
    // An upper bound: its limit's category and those below
    [[null, 4.9], ['low']],
    [[null, 9.1], ['low', 'normal']],
    [[null, 12], ['low', 'normal', 'high']],
    [[null, null], []],
    [null, []],
  ])('the band %j reaches %j', (band, categories) => {
    expect(categoriesInBand(band, defaults)).toEqual(categories)
  })

  it('takes the thresholds from the settings', () => {
    const settings = EstimateSettingsSchema.parse({ lowBelowCmH2O: 3, highAboveCmH2O: 12 })

    expect(categoriesInBand([3, 12], settings)).toEqual(['normal'])
  })
})

describe('elevatedOf', () => {
  // McGee 1998 (Am Heart J 136:10–18): elevated when the top is more than 3 cm above the sternal angle.
  it.each<[string, Parameters<typeof elevatedOf>[0], number | null, boolean | null]>([
    ['a point at 3.5 cm', 'point', 3.5, true],
    ['a point at 3 cm', 'point', 3, false],
    ['a lower bound at 3.5 cm', 'lower', 3.5, true],
    ['a lower bound at 3 cm', 'lower', 3, null],
    ['an upper bound', 'upper', null, false],
    ['no estimate', 'none', null, null],
  ])('calls %s %s', (_, bound, heightCm, elevated) => {
    expect(elevatedOf(bound, heightCm, defaults)).toBe(elevated)
  })
})

describe('CAUTION_TEXT', () => {
  it('says the estimate is from examination, with a wide band, and defers to judgement, protocols and practice', () => {
    expect(CAUTION_TEXT).toMatch(/physical examination/)
    expect(CAUTION_TEXT).toMatch(/wide error band/)
    expect(CAUTION_TEXT).toMatch(/clinical judgement, local protocols or licensed practice/)
  })

  it('carries McGee 1998: upright patients with heart failure may read lower than a supine catheter value', () => {
    // McGee 1998 (Am Heart J 136:10–18): a postural fall in heart failure makes clinicians underestimate supine CVP
    expect(CAUTION_TEXT).toContain('Upright patients with heart failure may read lower than a supine catheter value (McGee 1998)')
  })
})
