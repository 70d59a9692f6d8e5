import { describe, expect, it } from 'vitest'
import { columnMeasured, heightVertical, venousShortfall } from '@/utils/bedside-checks'
import { WORKED_EXAMPLE } from '../factories/draft'

const FOUR = { ...WORKED_EXAMPLE.venousSigns, 'changes-with-position': 'present' } as const

describe('bedside checks shared by the quick screen and the guided steps', () => {
  it('names no shortfall when the signs found reach the setting (three of six at the product default of 3)', () => {
    expect(venousShortfall(WORKED_EXAMPLE, 3)).toBeNull()
  })

  it('names the shortfall against the setting when the rhythm makes no sign absent', () => {
    expect(venousShortfall({ ...WORKED_EXAMPLE, venousSigns: FOUR, rhythm: 'sinus' }, 5)).toBe(
      'Only 4 venous signs were recorded present, fewer than the 5 required: the pulsation may be arterial',
    )
  })

  it('asks for one sign fewer in atrial fibrillation, where no double peak can be seen (no a wave)', () => {
    const noDoublePeak = { ...FOUR, 'double-peaked': 'absent', 'rises-with-abdominal-pressure': 'present' } as const
    const fibrillating = { ...WORKED_EXAMPLE, venousSigns: noDoublePeak, rhythm: 'atrial-fibrillation' } as const

    expect(venousShortfall(fibrillating, 6)).toContain('fewer than the 5 that can be present with this rhythm')
    expect(venousShortfall({ ...fibrillating, venousSigns: { ...noDoublePeak, 'obliterated-by-light-pressure': 'present' } }, 6)).toBeNull()
  })

  it('asks for a height when the top was seen or lies above the neck, and reads it vertically unless told otherwise', () => {
    expect(
      ['seen', 'above-neck', 'not-filled', 'not-assessable'].map((columnTop) => columnMeasured({ ...WORKED_EXAMPLE, columnTop } as never)),
    ).toEqual([true, true, false, false])
    expect(heightVertical({ ...WORKED_EXAMPLE, heightMethod: undefined })).toBe(true)
  })
})
