import { Chart } from 'chart.js'
import { paddedRange, withAxisRanges, withLineLegend } from '@/composables/chart-lines'

/** The bias and the limits of agreement of a Bland–Altman plot (Bland & Altman 1986, Lancet i:307–310). */
export interface AgreementLines {
  bias: number
  loa: readonly [number, number] | number[]
}

/**
 * The line colours: the bias in the theme's secondary (orange-brown), both limits in its info blue. The error red the
 * limits had before sat too close to the bias's brown to tell apart; blue against orange also stays apart for
 * red–green colour blindness (Okabe & Ito 2008, Color Universal Design).
 */
export function agreementLineColors(colors: { bias: string; identity: string }) {
  return { bias: colors.bias, limits: colors.identity }
}

/** The y-axis: the differences, the bias and both limits, padded beyond the outermost so none touches the frame. */
export function blandAltmanYRange(differences: readonly number[], lines: AgreementLines | null) {
  return paddedRange([...differences, ...(lines ? [lines.bias, ...lines.loa] : [])])
}

/** The x-axis: the means, padded; the bias and limit lines run across all of it. */
export function blandAltmanXRange(means: readonly number[]) {
  return paddedRange(means)
}

const defaultLabels = (chart: never) => Chart.defaults.plugins.legend.labels.generateLabels(chart)

/** The options with a legend that shows dashed lines dashed (chart.js's own labels, restyled). */
export function withLegendLines<O extends { plugins: { legend: { labels: object } } }>(options: O): O {
  return withLineLegend(options, defaultLabels)
}

/** The shared chart options with both axes reaching the padded ranges and a legend that shows dashed lines dashed. */
export function blandAltmanOptions<O extends { scales: Record<string, object>; plugins: { legend: { labels: object } } }>(
  options: O,
  ranges: { x: { min: number; max: number }; y: { min: number; max: number } },
): O {
  return withLegendLines(withAxisRanges(options, ranges))
}
