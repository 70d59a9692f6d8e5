import { describe, expect, it } from 'vitest'
import { DEFAULT_APP_SETTINGS } from '#shared/schemas/settings'
import { SETTING_GROUPS, changeText, defaultText, valueAt, withValueAt } from '@/components/settings/settings-fields'

const referenceField = SETTING_GROUPS.flatMap((g) => g.fields).find((f) => f.path === 'referenceWindowMinutes')

describe('settings fields', () => {
  it('offers the reference window, with its default of 60 minutes marked as a product default', () => {
    expect(referenceField).toBeDefined()
    expect(defaultText(referenceField!)).toBe('Default 60 minutes (product default, between 5 and 240)')
  })

  it('reads and replaces the reference window without touching the pairing window or the estimate settings', () => {
    const changed = withValueAt(DEFAULT_APP_SETTINGS, 'referenceWindowMinutes', 45)

    expect(valueAt(changed, 'referenceWindowMinutes')).toBe(45)
    expect(changed.pairWindowMinutes).toBe(DEFAULT_APP_SETTINGS.pairWindowMinutes)
    expect(changed.estimate).toEqual(DEFAULT_APP_SETTINGS.estimate)
  })

  it('still reads and replaces an estimate setting by its path', () => {
    const changed = withValueAt(DEFAULT_APP_SETTINGS, 'estimate.elevatedAboveCm', 4)

    expect(valueAt(changed, 'estimate.elevatedAboveCm')).toBe(4)
    expect(changed.referenceWindowMinutes).toBe(DEFAULT_APP_SETTINGS.referenceWindowMinutes)
  })

  it('words a change of the reference window for the history', () => {
    expect(changeText('referenceWindowMinutes', { from: 60, to: 30 })).toBe('Reference window (measured pressure to exam): 60 → 30 minutes')
  })
})
