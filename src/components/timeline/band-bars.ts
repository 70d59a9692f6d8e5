import type { Chart, Plugin } from 'chart.js'
import type { TimelineMark } from './timeline-series'

/** How far past a bound's point its open side is drawn, and the arrowhead's size (px). */
const OPEN_SIDE_PX = 28
const HEAD_PX = 6
const CAP_PX = 5

function arrowHead(ctx: CanvasRenderingContext2D, x: number, tipY: number, upward: boolean) {
  const back = upward ? tipY + HEAD_PX : tipY - HEAD_PX
  ctx.beginPath()
  ctx.moveTo(x - HEAD_PX, back)
  ctx.lineTo(x, tipY)
  ctx.lineTo(x + HEAD_PX, back)
  ctx.stroke()
}

function drawMark(chart: Chart, mark: TimelineMark) {
  const { ctx, scales } = chart
  const x = scales.x!.getPixelForValue(mark.x)
  const y = (value: number) => scales.y!.getPixelForValue(value)
  const top = mark.high !== null ? y(mark.high) : y(mark.y) - OPEN_SIDE_PX
  const bottom = mark.low !== null ? y(mark.low) : y(mark.y) + OPEN_SIDE_PX
  ctx.beginPath()
  ctx.moveTo(x, top)
  ctx.lineTo(x, bottom)
  for (const end of [mark.high === null ? null : top, mark.low === null ? null : bottom]) {
    if (end === null) continue
    ctx.moveTo(x - CAP_PX, end)
    ctx.lineTo(x + CAP_PX, end)
  }
  ctx.stroke()
  // A bound is open on one side: the arrow says the true value lies that way, without a limit.
  if (mark.high === null) arrowHead(ctx, x, top, true)
  if (mark.low === null) arrowHead(ctx, x, bottom, false)
}

/** Draws each exam's 95% band as an error bar, and a bound's open side as an arrow, behind the points. */
export function bandBars(marks: () => TimelineMark[], color: () => string): Plugin<'scatter'> {
  return {
    id: 'plumblineBandBars',
    beforeDatasetsDraw(chart: Chart) {
      const { ctx, chartArea } = chart
      ctx.save()
      ctx.beginPath()
      ctx.rect(chartArea.left, chartArea.top, chartArea.width, chartArea.height)
      ctx.clip()
      ctx.strokeStyle = color()
      ctx.lineWidth = 1.5
      for (const mark of marks()) drawMark(chart, mark)
      ctx.restore()
    },
  }
}
