import { describe, expect, it } from 'vitest'
import { asLineLegendItem, paddedRange, sharedRange, straightLine, withAxisRanges, withLineLegend } from '@/composables/chart-lines'

describe('paddedRange', () => {
  it('reaches a tenth of the span beyond the lowest and the highest value', () => {
    // Values −3 to +2: span 5, a tenth of it 0.5 each side.
    expect(paddedRange([-3, 0.4, 2])).toEqual({ min: -3.5, max: 2.5 })
  })

  it('keeps every value strictly inside the range, so none is drawn on the frame', () => {
    const values = [1.2, -4.8, 0, 3.3]

    const { min, max } = paddedRange(values)

    expect(values.every((v) => v > min && v < max)).toBe(true)
  })

  it('gives one value ±1 around it and no value 0 to 1', () => {
    expect(paddedRange([4, 4])).toEqual({ min: 3, max: 5 })
    expect(paddedRange([])).toEqual({ min: 0, max: 1 })
  })

  it('ignores values that are not finite', () => {
    expect(paddedRange([0, Number.NaN, 10, Number.POSITIVE_INFINITY])).toEqual({ min: -1, max: 11 })
  })
})

describe('sharedRange', () => {
  it('gives both axes the same padded range over every x and y, so the line of identity meets the corners at 45°', () => {
    const ranges = sharedRange([
      { x: 2, y: 6 },
      { x: 10, y: 4 },
    ])

    // Values 2 to 10: span 8, 0.8 each side.
    expect(ranges.x).toEqual({ min: 1.2, max: 10.8 })
    expect(ranges.y).toEqual(ranges.x)
  })
})

describe('withAxisRanges', () => {
  it('makes the named axes reach at least the range and keeps their titles and the other options', () => {
    const options = { responsive: true, scales: { x: { title: { text: 'Mean' } }, y: { ticks: { color: 'red' } } } }

    const ranged = withAxisRanges(options, { y: { min: -2, max: 3 } })

    expect(ranged.scales.y).toEqual({ ticks: { color: 'red' }, suggestedMin: -2, suggestedMax: 3 })
    expect(ranged.scales.x).toEqual({ title: { text: 'Mean' } })
    expect(ranged.responsive).toBe(true)
    expect(options.scales.y).not.toHaveProperty('suggestedMin')
  })
})

describe('the legend of line datasets', () => {
  const dashed = straightLine('Upper limit', { x: 0, y: 1 }, { x: 1, y: 1 }, '#2F6690', [6, 4])
  // What chart.js's legend makes with point styles on: the first point's style, with no dash and a 1 px border.
  const pointItem = { datasetIndex: 0, lineDash: undefined, lineWidth: 0.5, strokeStyle: '#2F6690', text: 'Upper limit' }

  it('draws a dashed line dataset dashed, at its width and colour', () => {
    const item = asLineLegendItem(pointItem, dashed)

    expect(item).toMatchObject({ lineDash: [6, 4], lineWidth: 2, strokeStyle: '#2F6690', text: 'Upper limit' })
  })

  it('draws a solid line solid and leaves a points dataset as chart.js made it', () => {
    const solid = straightLine('Bias', { x: 0, y: 0 }, { x: 1, y: 0 }, '#9E5620')
    const points = { label: 'Pairs', data: [], pointRadius: 3, pointStyle: 'circle' }

    expect(asLineLegendItem(pointItem, solid).lineDash).toEqual([])
    expect(asLineLegendItem(pointItem, points)).toEqual(pointItem)
  })

  it('wraps the legend labels of the options, restyling each item by its dataset', () => {
    const options = { plugins: { legend: { position: 'bottom', labels: { usePointStyle: true } } } }
    const chart = { data: { datasets: [{ label: 'Pairs' }, dashed] } }
    const defaults = () => [{ datasetIndex: 0 }, { ...pointItem, datasetIndex: 1 }]

    const legend = withLineLegend(options, defaults).plugins.legend as {
      position: string
      labels: { usePointStyle: boolean; generateLabels: (c: typeof chart) => object[] }
    }

    expect(legend.position).toBe('bottom')
    expect(legend.labels.usePointStyle).toBe(true)
    expect(legend.labels.generateLabels(chart)).toEqual([
      { datasetIndex: 0 },
      expect.objectContaining({ datasetIndex: 1, lineDash: [6, 4] }),
    ])
  })
})
