import { describe, expect, it } from 'vitest'
import { plumblineThemes } from '@/plugins/themes'

// Relative luminance and contrast ratio as defined in WCAG 2.1 (W3C Recommendation 2018, "relative luminance",
// "contrast ratio"); SC 1.4.3 asks 4.5:1 for body text.
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5]
    .map((at) => parseInt(hex.slice(at, at + 2), 16) / 255)
    .map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4))
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!
}

function contrast(a: string, b: string): number {
  const [light, dark] = [luminance(a), luminance(b)].sort((x, y) => y - x)
  return (light! + 0.05) / (dark! + 0.05)
}

const AA_BODY_TEXT = 4.5
const NAMED = ['primary', 'secondary', 'error', 'warning', 'info', 'success']

describe('the light and dark themes', () => {
  it('checks contrast the WCAG way: black on white is 21:1, and a mid grey #767676 on white just passes 4.5:1', () => {
    expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 5)
    expect(contrast('#767676', '#FFFFFF')).toBeGreaterThanOrEqual(AA_BODY_TEXT)
    expect(contrast('#777777', '#FFFFFF')).toBeLessThan(AA_BODY_TEXT)
  })

  for (const [theme, { colors }] of Object.entries(plumblineThemes)) {
    // The themes declare every colour as a hex string.
    const colour = (name: string) => String(colors?.[name])
    for (const name of NAMED) {
      it(`${theme}: text on ${name} (buttons, app bar, demo ribbon) reaches 4.5:1`, () => {
        const ink = colour(`on-${name}`)

        expect(ink, `on-${name} is set`).toMatch(/^#[0-9A-F]{6}$/i)
        expect(contrast(colour(name), ink)).toBeGreaterThanOrEqual(AA_BODY_TEXT)
      })

      it(`${theme}: ${name} as text on the background and on the surface reaches 4.5:1`, () => {
        expect(contrast(colour(name), colour('background'))).toBeGreaterThanOrEqual(AA_BODY_TEXT)
        expect(contrast(colour(name), colour('surface'))).toBeGreaterThanOrEqual(AA_BODY_TEXT)
      })
    }
  }
})
