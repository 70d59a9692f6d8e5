/** A straight line across a scatter chart, drawn without points and shown in the legend as a line. */
export function straightLine(
  label: string,
  from: { x: number; y: number },
  to: { x: number; y: number },
  color: string,
  dash: number[] = [],
) {
  return {
    label,
    data: [from, to],
    showLine: true,
    borderColor: color,
    backgroundColor: color,
    borderWidth: 2,
    borderDash: dash,
    pointRadius: 0,
    pointStyle: 'line' as const,
  }
}

/** The line of identity (y = x) across the range of every x and y shown, for a scatter of two measures of one thing. */
export function identityLine(label: string, points: readonly { x: number; y: number }[], color: string) {
  const values = points.flatMap((p) => [p.x, p.y])
  const [low, high] = values.length ? [Math.min(...values), Math.max(...values)] : [0, 1]
  return straightLine(label, { x: low, y: low }, { x: high, y: high }, color)
}

/** How far beyond the outermost value a padded axis reaches, as a share of the span (product default, no published source). */
export const AXIS_PADDING = 0.1

/**
 * An axis range reaching `padding` of the span beyond the lowest and highest value, so points and lines at the extremes
 * are drawn whole inside the frame; one value (or none) gets ±1 around it (or 0 to 1).
 */
export function paddedRange(values: readonly number[], padding = AXIS_PADDING): { min: number; max: number } {
  const finite = values.filter(Number.isFinite)
  if (!finite.length) return { min: 0, max: 1 }
  const low = Math.min(...finite)
  const high = Math.max(...finite)
  const margin = high > low ? (high - low) * padding : 1
  return { min: low - margin, max: high + margin }
}

interface AxisOptions {
  scales: Record<string, object>
}

/**
 * The chart's options with each named axis reaching at least the given range (chart.js then ends it on the next round
 * tick beyond, not on an odd padded value); other axes and settings are kept.
 */
export function withAxisRanges<O extends AxisOptions>(options: O, ranges: Record<string, { min: number; max: number }>): O {
  const scales = { ...options.scales }
  for (const [axis, range] of Object.entries(ranges)) scales[axis] = { ...scales[axis], suggestedMin: range.min, suggestedMax: range.max }
  return { ...options, scales }
}

/** What the legend needs of a dataset to draw its line as the chart does. */
interface LineDataset {
  pointStyle?: unknown
  borderDash?: number[]
  borderWidth?: number | object
  borderColor?: unknown
}

/** What chart.js's legend item holds that a line changes. */
interface LegendLine {
  datasetIndex?: number
  lineDash?: number[]
  lineWidth?: number
  strokeStyle?: unknown
}

/**
 * A legend item drawing a line dataset (point style `line`, as `straightLine` makes) as its line: with point styles on,
 * chart.js takes the style of the first point, which has no dash and a thin border, so a dashed line showed solid.
 */
export function asLineLegendItem<T extends LegendLine>(item: T, dataset: LineDataset | undefined): T {
  if (dataset?.pointStyle !== 'line') return item
  const width = typeof dataset.borderWidth === 'number' ? dataset.borderWidth : 2
  return { ...item, lineDash: dataset.borderDash ?? [], lineWidth: width, strokeStyle: dataset.borderColor ?? item.strokeStyle }
}

type GenerateLabels = (chart: never) => LegendLine[]

/** The options with a legend that draws dashed lines dashed, wrapping chart.js's own labels. */
export function withLineLegend<O extends { plugins: { legend: { labels: object } } }>(options: O, defaults: GenerateLabels): O {
  const generateLabels = (chart: { data: { datasets: LineDataset[] } }) =>
    defaults(chart as never).map((item) => asLineLegendItem(item, chart.data.datasets[item.datasetIndex ?? -1]))
  const legend = { ...options.plugins.legend, labels: { ...options.plugins.legend.labels, generateLabels } }
  return { ...options, plugins: { ...options.plugins, legend } }
}

/** One padded range for both axes of a scatter of two measures of one thing, so both read on the same scale. */
export function sharedRange(points: readonly { x: number; y: number }[]) {
  const range = paddedRange(points.flatMap((p) => [p.x, p.y]))
  return { x: range, y: range }
}
