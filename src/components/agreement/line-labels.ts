import type { Chart, Plugin } from 'chart.js'

const FONT_PX = 12
const GAP_PX = 3

/**
 * Where a label's baseline goes: just above its line, but never above the plot area's top (where the canvas would cut
 * the text off, as it did for the line of identity ending in the top corner) nor below its bottom.
 */
export function labelBaselineY(lineY: number, area: { top: number; bottom: number }, fontPx = FONT_PX): number {
  const wanted = lineY - GAP_PX
  return Math.min(Math.max(wanted, area.top + fontPx + GAP_PX), area.bottom - GAP_PX)
}

/**
 * Writes each labelled dataset's label at the right end of its line, so the bias and limit lines are named on the plot
 * itself and not only in the legend. `labels` maps a dataset index to its text.
 */
export function lineEndLabels(labels: () => Record<number, string>, color: () => string): Plugin<'scatter' | 'line'> {
  return {
    id: 'plumblineLineEndLabels',
    afterDatasetsDraw(chart: Chart) {
      const { ctx, chartArea } = chart
      ctx.save()
      ctx.font = `${FONT_PX}px Roboto, sans-serif`
      ctx.fillStyle = color()
      ctx.textAlign = 'right'
      ctx.textBaseline = 'bottom'
      for (const [index, text] of Object.entries(labels())) {
        const points = chart.getDatasetMeta(Number(index)).data
        const last = points[points.length - 1]
        if (!last || !chart.isDatasetVisible(Number(index))) continue
        ctx.fillText(text, chartArea.right - 4, labelBaselineY(last.y, chartArea))
      }
      ctx.restore()
    },
  }
}
