import { describe, expect, it } from 'vitest'
import { Chart, Legend } from 'chart.js'
import { agreementLineColors, blandAltmanOptions, blandAltmanXRange, blandAltmanYRange } from '@/components/agreement/bland-altman-lines'
import { straightLine } from '@/composables/chart-lines'
import { plumblineThemes } from '@/plugins/themes'

/** Hue in degrees of a #RRGGBB colour (the standard RGB-to-HSL conversion). */
function hue(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255) as [number, number, number]
  const max = Math.max(r, g, b)
  const d = max - Math.min(r, g, b)
  if (d === 0) return 0
  const h = max === r ? ((g - b) / d) % 6 : max === g ? (b - r) / d + 2 : (r - g) / d + 4
  return (h * 60 + 360) % 360
}

const hueDistance = (a: string, b: string) => Math.min(Math.abs(hue(a) - hue(b)), 360 - Math.abs(hue(a) - hue(b)))

describe('blandAltmanYRange', () => {
  it('leaves a tenth of the span above and below the outermost of the differences and the limits', () => {
    // Differences −1, −2, +0.5; limits −2.895 and +1.145: outermost −2.895 to +1.145, span 4.04, 0.404 each side.
    const range = blandAltmanYRange([-1, -2, 0.5], { bias: -0.875, loa: [-2.895, 1.145] })

    expect(range.min).toBeCloseTo(-3.299, 10)
    expect(range.max).toBeCloseTo(1.549, 10)
  })

  it('reaches past a difference lying beyond the limits', () => {
    const range = blandAltmanYRange([-1, 6], { bias: 0, loa: [-2, 2] })

    expect(range.max).toBeGreaterThan(6)
    expect(range.min).toBeLessThan(-2)
  })

  it('without limits, pads the differences alone', () => {
    expect(blandAltmanYRange([-1, 1], null)).toEqual({ min: -1.2, max: 1.2 })
  })
})

describe('blandAltmanXRange', () => {
  it('pads the means so the first and last points are not on the frame', () => {
    // Means 1.5 to 4.75: span 3.25, 0.325 each side.
    const range = blandAltmanXRange([3.5, 3, 4.75, 1.5])

    expect(range.min).toBeCloseTo(1.175, 10)
    expect(range.max).toBeCloseTo(5.075, 10)
  })
})

describe('agreementLineColors', () => {
  it.each(Object.entries(plumblineThemes))('in %s, gives the limits a hue far from the bias line’s', (_name, theme) => {
    const colors = theme.colors as Record<string, string>

    const lines = agreementLineColors({ bias: colors.secondary!, identity: colors.info! })

    expect(lines.limits).not.toBe(lines.bias)
    expect(hueDistance(lines.limits, lines.bias)).toBeGreaterThanOrEqual(90)
  })
})

// The app registers the legend with the charts (composables/agreement-chart.ts); its default labels are what is wrapped.
Chart.register(Legend)

describe('blandAltmanOptions', () => {
  const base = { scales: { x: { title: { text: 'Mean' } }, y: {} }, plugins: { legend: { labels: { usePointStyle: true } } } }

  it('makes both axes reach at least the ranges given', () => {
    const options = blandAltmanOptions(base, { x: { min: 1, max: 5 }, y: { min: -3, max: 2 } })

    expect(options.scales).toEqual({
      x: { title: { text: 'Mean' }, suggestedMin: 1, suggestedMax: 5 },
      y: { suggestedMin: -3, suggestedMax: 2 },
    })
  })

  it('makes chart.js’s legend show the dashed limit lines dashed and the bias line solid', () => {
    const datasets = [
      { label: 'Pairs', data: [], backgroundColor: '#1F5C63', borderColor: '#1F5C63', pointRadius: 3, pointStyle: 'circle' as const },
      straightLine('Upper limit', { x: 0, y: 1 }, { x: 1, y: 1 }, '#2F6690', [6, 4]),
      straightLine('Bias', { x: 0, y: 0 }, { x: 1, y: 0 }, '#9E5620'),
    ]
    // The parts of a chart that chart.js's own generateLabels reads; with point styles on it asks for a point's style.
    const chart = {
      data: { datasets },
      legend: { options: { labels: { usePointStyle: true } } },
      _getSortedDatasetMetas: () =>
        datasets.map((d, index) => ({
          index,
          visible: true,
          controller: {
            getStyle: () => ({ borderWidth: 1, backgroundColor: d.backgroundColor, borderColor: d.borderColor, pointStyle: d.pointStyle }),
          },
        })),
    }
    const options = blandAltmanOptions(base, { x: { min: 0, max: 1 }, y: { min: 0, max: 1 } })

    const items = (
      options.plugins.legend.labels as unknown as { generateLabels: (c: typeof chart) => { text: string; lineDash?: number[] }[] }
    ).generateLabels(chart)

    expect(items.map((i) => [i.text, i.lineDash])).toEqual([
      ['Pairs', undefined],
      ['Upper limit', [6, 4]],
      ['Bias', []],
    ])
  })
})
