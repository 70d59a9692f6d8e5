import { describe, expect, it } from 'vitest'
import {
  AppSettingsSchema,
  AppSettingsUpdateSchema,
  DEFAULT_APP_SETTINGS,
  DEFAULT_ESTIMATE_SETTINGS,
  settingsChanges,
  settingsVersionOf,
  withDefaults,
  type AppSettings,
} from '#shared/schemas/settings'

const withEstimate = (estimate: Partial<AppSettings['estimate']>): AppSettings => ({
  ...DEFAULT_APP_SETTINGS,
  estimate: { ...DEFAULT_ESTIMATE_SETTINGS, ...estimate },
})

function fieldErrors(value: unknown): Record<string, string> {
  const result = AppSettingsSchema.safeParse(value)
  return Object.fromEntries((result.error?.issues ?? []).map((issue) => [issue.path.join('.'), issue.message]))
}

describe('the default settings', () => {
  it('hold the cited thresholds and error terms of the estimate', () => {
    // McGee 1998 (elevated h > 3 cm); Cook 1990 categories (low < 5, high > 10 cmH₂O); σ_offset 1.0 cm from
    // Seth 2002's supine IQR 4.7–6.1 cm ÷ 1.349; σ_read 0.5/1.5 and σ_observer 2.0 cm are product defaults, no source.
    expect(DEFAULT_ESTIMATE_SETTINGS).toEqual({
      elevatedAboveCm: 3,
      lowBelowCmH2O: 5,
      highAboveCmH2O: 10,
      sigmaReadRulerCm: 0.5,
      sigmaReadVisualCm: 1.5,
      sigmaOffsetCm: 1,
      sigmaOffsetOutsideRangeCm: 2,
      sigmaObserverCm: 2,
      minVenousSigns: 3,
    })
    expect((6.1 - 4.7) / 1.349).toBeCloseTo(DEFAULT_ESTIMATE_SETTINGS.sigmaOffsetCm, 1)
  })

  it('pass their own checks, with a 120-minute pairing window and photos off', () => {
    expect(AppSettingsSchema.parse(DEFAULT_APP_SETTINGS)).toEqual(DEFAULT_APP_SETTINGS)
    expect(DEFAULT_APP_SETTINGS).toMatchObject({ pairWindowMinutes: 120, defaultOffsetModel: 'incline-adjusted', photosAllowed: false })
  })
})

describe('AppSettingsSchema cross-field checks', () => {
  it('a low-CVP threshold equal to the high one is refused on both fields', () => {
    const errors = fieldErrors(withEstimate({ lowBelowCmH2O: 10, highAboveCmH2O: 10 }))

    expect(Object.keys(errors).sort()).toEqual(['estimate.highAboveCmH2O', 'estimate.lowBelowCmH2O'])
    expect(errors['estimate.highAboveCmH2O']).toBe('The high-CVP threshold must be above the low-CVP threshold (10 cmH₂O)')
  })

  it('a low threshold just below the high one is accepted', () => {
    expect(fieldErrors(withEstimate({ lowBelowCmH2O: 9.9, highAboveCmH2O: 10 }))).toEqual({})
  })

  it('a visual reading error below the ruler reading error is refused on the visual one', () => {
    const errors = fieldErrors(withEstimate({ sigmaReadRulerCm: 1, sigmaReadVisualCm: 0.8 }))

    expect(errors).toEqual({ 'estimate.sigmaReadVisualCm': 'A visual reading cannot be more precise than a ruler reading (1 cm)' })
  })

  it('an offset error above 60° smaller than the one within the studied range is refused', () => {
    const errors = fieldErrors(withEstimate({ sigmaOffsetCm: 1.5, sigmaOffsetOutsideRangeCm: 1 }))

    expect(Object.keys(errors)).toEqual(['estimate.sigmaOffsetOutsideRangeCm'])
  })

  it('equal reading errors and equal offset errors are accepted', () => {
    expect(fieldErrors(withEstimate({ sigmaReadRulerCm: 1, sigmaReadVisualCm: 1, sigmaOffsetCm: 2, sigmaOffsetOutsideRangeCm: 2 }))).toEqual({})
  })
})

describe('AppSettingsSchema bounds', () => {
  it('names each value out of range by its path with its bound', () => {
    const errors = fieldErrors({ ...withEstimate({ sigmaObserverCm: 0, minVenousSigns: 7 }), pairWindowMinutes: 1441 })

    expect(errors).toEqual({
      'estimate.sigmaObserverCm': 'The default observer error must be above 0 cm',
      'estimate.minVenousSigns': 'At most 6 signs (there are six)',
      pairWindowMinutes: 'The pairing window is at most 1440 minutes (one day)',
    })
  })

  it('accepts the window bounds of 15 and 1440 minutes and refuses a fraction of a minute', () => {
    expect(fieldErrors({ ...DEFAULT_APP_SETTINGS, pairWindowMinutes: 15 })).toEqual({})
    expect(fieldErrors({ ...DEFAULT_APP_SETTINGS, pairWindowMinutes: 1440 })).toEqual({})
    expect(fieldErrors({ ...DEFAULT_APP_SETTINGS, pairWindowMinutes: 90.5 })).toEqual({ pairWindowMinutes: 'Enter a whole number of minutes' })
  })

  it('a save needs every value: a missing one is named rather than silently defaulted', () => {
    const { estimate, ...rest } = DEFAULT_APP_SETTINGS
    const { elevatedAboveCm: _missing, ...partial } = estimate

    const result = AppSettingsUpdateSchema.safeParse({ ...rest, estimate: partial, baseVersion: 1 })

    expect(result.error?.issues.map((i) => i.path.join('.'))).toEqual(['estimate.elevatedAboveCm'])
  })
})

describe('reading stored settings', () => {
  it('gives a setting added after the version was stored its default', () => {
    const { photosAllowed: _added, ...older } = DEFAULT_APP_SETTINGS
    const { minVenousSigns: _alsoAdded, ...olderEstimate } = older.estimate

    expect(withDefaults({ ...older, estimate: { ...olderEstimate, highAboveCmH2O: 12 } })).toEqual(withEstimate({ highAboveCmH2O: 12 }))
  })

  it('an estimate without a settings version was computed with version 1, the defaults', () => {
    expect(settingsVersionOf({})).toBe(1)
    expect(settingsVersionOf({ settingsVersion: 4 })).toBe(4)
  })
})

describe('settingsChanges', () => {
  it('lists only the values that differ, by path, with before and after', () => {
    const after = { ...withEstimate({ lowBelowCmH2O: 4 }), photosAllowed: true }

    expect(settingsChanges(DEFAULT_APP_SETTINGS, after)).toEqual({
      'estimate.lowBelowCmH2O': { from: 5, to: 4 },
      photosAllowed: { from: false, to: true },
    })
    expect(settingsChanges(DEFAULT_APP_SETTINGS, DEFAULT_APP_SETTINGS)).toEqual({})
  })
})
