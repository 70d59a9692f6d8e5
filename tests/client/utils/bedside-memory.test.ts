import { beforeEach, describe, expect, it, vi } from 'vitest'
import { lastChoices, modeFromQuery, rememberChoices, rememberMode, rememberedMode } from '@/utils/bedside-memory'

describe('the recording mode remembered on this device', () => {
  beforeEach(() => localStorage.clear())

  it('is the guided steps until the user chooses', () => {
    expect(rememberedMode()).toBe('guided')
    expect(modeFromQuery(undefined)).toBe('guided')
  })

  it('is the mode last chosen, also when the address names none', () => {
    rememberMode('quick')

    expect(rememberedMode()).toBe('quick')
    expect(modeFromQuery(undefined)).toBe('quick')
  })

  it('gives way to a mode named in the address, without changing what is remembered', () => {
    rememberMode('quick')

    expect(modeFromQuery('guided')).toBe('guided')
    expect(rememberedMode()).toBe('quick')
  })

  it('ignores an unknown mode in the address or in storage', () => {
    rememberMode('quick')
    expect(modeFromQuery('fast')).toBe('quick')

    localStorage.setItem('plumbline.record.mode', '"turbo"')
    expect(rememberedMode()).toBe('guided')
  })

  it('when storage refuses, forgets the choice instead of failing', () => {
    const setItem = vi.spyOn(Storage.prototype, 'setItem').mockImplementation(() => {
      throw new DOMException('full', 'QuotaExceededError')
    })

    expect(() => rememberMode('quick')).not.toThrow()
    expect(rememberedMode()).toBe('guided')
    setItem.mockRestore()
  })
})

describe('the team and angle carried to the next patient', () => {
  beforeEach(() => localStorage.clear())

  it('keeps the last team and inclination, each updated on its own', () => {
    rememberChoices({ teamId: 't-1', inclinationDeg: 45 })
    rememberChoices({ teamId: 't-2' })

    expect(lastChoices()).toEqual({ teamId: 't-2', inclinationDeg: 45 })
  })

  it('does not keep an angle outside 0–90°', () => {
    rememberChoices({ teamId: 't-1', inclinationDeg: 120 })

    expect(lastChoices()).toEqual({})
  })
})
