import type { Chart, Plugin } from 'chart.js'

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
      ctx.font = '12px Roboto, sans-serif'
      ctx.fillStyle = color()
      ctx.textAlign = 'right'
      ctx.textBaseline = 'bottom'
      for (const [index, text] of Object.entries(labels())) {
        const points = chart.getDatasetMeta(Number(index)).data
        const last = points[points.length - 1]
        if (!last || !chart.isDatasetVisible(Number(index))) continue
        ctx.fillText(text, chartArea.right - 4, last.y - 3)
      }
      ctx.restore()
    },
  }
}
